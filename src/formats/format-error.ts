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
