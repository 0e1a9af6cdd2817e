/**
 * A request the service cannot take, in domain terms: the caller's mistake (400), a limit (413,
 * 422) or a missing resource (404), with the offending fields. Services throw it; the HTTP error
 * handler answers it as a problem response (RFC 9457) naming the fields, and worker tasks return
 * it as data. It carries no HTTP types.
 */

export interface FieldProblem {
  /** Dotted path in the request as the caller wrote it, e.g. "observations.3.epoch", "query.to". */
  field: string;
  message: string;
}

export class CallerError extends Error {
  override readonly name = 'CallerError';
  constructor(
    readonly status: 400 | 404 | 409 | 413 | 422,
    /** The problem's detail line. */
    detail: string,
    readonly errors: FieldProblem[] = [],
  ) {
    super(detail);
  }

  /** One field, detail "field: message". */
  static field(status: CallerError['status'], field: string, message: string): CallerError {
    return new CallerError(status, `${field}: ${message}`, [{ field, message }]);
  }
}
