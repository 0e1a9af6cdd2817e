/**
 * A whole ZWD-estimation request, from the body bytes to the JSON answer, as one task that runs in
 * a worker thread: parsing (JSON or CSV), validation against the body schema, the estimation, the
 * response object and its serialisation. The event loop only moves bytes, so health checks and
 * light requests never wait behind a large body or a long estimation.
 *
 * Errors come back as data (a problem status, detail and field errors), because thrown errors lose
 * their fields across the thread boundary.
 */

import { ModelDomainError } from '../domain/errors.js';
import { detailOf, issuesToFieldErrors } from '../http/field-errors.js';
import { HttpProblem, type FieldError } from '../http/problem.js';
import {
  zwdEstimatesRequest,
  zwdEstimationBody,
  type ZwdEstimatesResponse,
  type ZwdEstimationBody,
} from '../http/schemas/zwd-estimates.js';
import { csvRequestBody } from '../http/zwd-csv.js';
import { runZwdEstimation, type ZwdSite } from './zwd-estimation.js';

export interface ZwdRequestTaskInput {
  /** The request body as received: JSON bytes or CSV text. */
  body: Uint8Array | string;
  format: 'json' | 'csv';
  /** Raw query parameters (options of a CSV request). */
  query: Record<string, unknown>;
  /** The site when the caller does not send it (a station's estimation); then `site` in the body is refused. */
  site?: ZwdSite | undefined;
  /** Met records to use when the body has none (a station's stored met series). */
  defaultMet?: ZwdEstimationBody['met'] | undefined;
  /** Also return the response object (for a caller that stores it). */
  keepResult?: boolean | undefined;
}

export interface ZwdRequestTaskOutput {
  json: string;
  result?: ZwdEstimatesResponse;
  /** Observations sent, for the metrics. */
  observations: number;
  /** The options after defaults, as validated. */
  body?: ZwdEstimationBody;
}

export type TaskOutcome<O> = { ok: true; output: O } | { ok: false; error: { status: number; detail: string; errors?: FieldError[] } };

function fail(status: number, errors: FieldError[]): TaskOutcome<never> {
  return { ok: false, error: { status, detail: detailOf(errors), errors } };
}

export async function handleZwdRequest(input: ZwdRequestTaskInput): Promise<TaskOutcome<ZwdRequestTaskOutput>> {
  try {
    const text = typeof input.body === 'string' ? input.body : Buffer.from(input.body.buffer, input.body.byteOffset, input.body.byteLength).toString('utf8');
    let raw: unknown;
    if (input.format === 'csv') {
      raw = csvRequestBody(text, input.query, input.site !== undefined);
    } else {
      try {
        raw = JSON.parse(text);
      } catch (err) {
        return fail(400, [{ field: 'body', message: `not valid JSON (${err instanceof Error ? err.message : String(err)})` }]);
      }
    }
    let site: ZwdSite;
    let body: ZwdEstimationBody;
    if (input.site) {
      const parsed = zwdEstimationBody.safeParse(raw);
      if (!parsed.success) return fail(400, issuesToFieldErrors(parsed.error.issues));
      site = input.site;
      body = parsed.data;
    } else {
      const parsed = zwdEstimatesRequest.safeParse(raw);
      if (!parsed.success) return fail(400, issuesToFieldErrors(parsed.error.issues));
      ({ site, ...body } = parsed.data);
    }
    if (body.met === undefined && input.defaultMet !== undefined && input.defaultMet.length > 0) body = { ...body, met: input.defaultMet };
    const result = await runZwdEstimation(site, body);
    return {
      ok: true,
      output: {
        json: JSON.stringify(result),
        observations: body.observations.length,
        ...(input.keepResult ? { result, body } : {}),
      },
    };
  } catch (err) {
    if (err instanceof ModelDomainError) return fail(err.status, [{ field: err.field, message: err.message }]);
    if (err instanceof HttpProblem) return { ok: false, error: { status: err.status, detail: err.message, ...(err.errors ? { errors: err.errors } : {}) } };
    throw err;
  }
}
