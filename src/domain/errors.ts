/**
 * An input that is well-formed but outside a model's domain, or a computation that cannot
 * answer (a singular system). The HTTP layer turns it into a 4xx problem response naming
 * `field`; the domain never imports HTTP code.
 */
export class ModelDomainError extends Error {
  override readonly name = 'ModelDomainError';
  constructor(
    /** Dotted path of the offending input, e.g. "records.3.pressure_hpa". */
    readonly field: string,
    message: string,
    /** 400 for a caller's mistake that no schema can express, 422 when the model cannot answer. */
    readonly status: 400 | 422 = 422,
  ) {
    super(message);
  }
}
