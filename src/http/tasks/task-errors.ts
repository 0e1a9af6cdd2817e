/**
 * Errors of the caller's making inside a compute task, returned as data (a thrown error loses its
 * fields across the thread boundary); anything else is rethrown and becomes a 500.
 */

import { ModelDomainError } from '../../domain/errors.js';
import { FormatError, RecordLimitError } from '../../formats/format-error.js';
import { CallerError } from '../../services/caller-error.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { detailOf } from '../field-errors.js';
import type { FieldError } from '../problem.js';

export function fail(status: number, errors: FieldError[]): TaskOutcome<never> {
  return { ok: false, error: { status, detail: detailOf(errors), errors } };
}

/** FormatError → 400, RecordLimitError → 413, CallerError → its status, ModelDomainError → its status; anything else is rethrown. */
export function asOutcome(err: unknown): TaskOutcome<never> {
  if (err instanceof FormatError) return fail(400, [{ field: err.field, message: err.reason }]);
  if (err instanceof RecordLimitError) return fail(413, [{ field: 'body', message: err.message }]);
  if (err instanceof CallerError)
    return { ok: false, error: { status: err.status, detail: err.message, ...(err.errors.length ? { errors: err.errors } : {}) } };
  if (err instanceof ModelDomainError) return fail(err.status, [{ field: err.field, message: err.message }]);
  throw err;
}
