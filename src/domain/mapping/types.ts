/** Site and epoch a mapping function is prepared for. */
export interface MappingContext {
  /** Geodetic latitude [rad]. */
  latitudeRad: number;
  /** Site height [m] (above the ellipsoid in the API; Niell's height correction uses it in km). */
  heightM: number;
  /** Fractional day of year in UTC, 1 January 00:00 = 1.0 [d]. */
  dayOfYear: number;
  /** Caller-supplied coefficients for models that need them (VMF1 a coefficients). */
  coefficients?: { ah: number; aw: number } | undefined;
}

/** A mapping function evaluated for one site and epoch. */
export interface MappingEvaluator {
  /** @param elevationRad vacuum elevation [rad], (0, π/2] @returns hydrostatic mapping factor [-] */
  hydrostatic(elevationRad: number): number;
  /** @param elevationRad vacuum elevation [rad], (0, π/2] @returns wet mapping factor [-] */
  wet(elevationRad: number): number;
}

export interface MappingModel {
  /** API key, e.g. "niell". */
  key: string;
  /** Short citation that goes into a result's model description. */
  citation: string;
  /** True when the caller must send `coefficients`. */
  requiresCoefficients: boolean;
  prepare(context: MappingContext): MappingEvaluator;
}
