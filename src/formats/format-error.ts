/**
 * A request body that is not what it claims to be, found by a reader: `field` names the place
 * ("body", "observations.12.residual_m", "query.zwd_interval_s"), `reason` says what is wrong and
 * what is allowed. The HTTP layer answers it with a 400 problem naming the field.
 */
export class FormatError extends Error {
  override readonly name = 'FormatError';
  constructor(
    readonly field: string,
    readonly reason: string,
  ) {
    super(`${field}: ${reason}`);
  }
}

/**
 * An upload holds more records than the service takes (`limit`, e.g. MAX_MET_RECORDS). Thrown by a
 * reader as soon as it meets record limit + 1 (`line`, 1-based), so the rest of the text is never
 * parsed. The HTTP layer answers it with a 413 problem naming the limit.
 */
export class RecordLimitError extends Error {
  override readonly name = 'RecordLimitError';
  constructor(
    readonly limit: number,
    readonly line: number,
    readonly what: string,
  ) {
    super(`more than ${limit} ${what} (record ${limit + 1} at line ${line}); an upload holds at most ${limit}: split it`);
  }
}
