/**
 * What the caller's mapping coefficients refer to, for the hydrostatic height correction:
 * - "sea-level": coefficients of a grid or of mean sea level (the VMF1 grids); Niell's (1996) height
 *   correction carries them from sea level to the site's height above sea level;
 * - "site": coefficients computed for the site itself (ray traces at the station, the VMF1 site
 *   files); they already hold the site's height, so no height correction is added.
 */
export type CoefficientsHeightReference = 'site' | 'sea-level';
export const COEFFICIENTS_HEIGHT_REFERENCES = ['site', 'sea-level'] as const satisfies readonly CoefficientsHeightReference[];

/** Caller-supplied coefficients for models that need them (VMF1 a coefficients). */
export interface MappingCoefficients {
  ah: number;
  aw: number;
  /** What ah refers to; absent = DEFAULT_COEFFICIENTS_HEIGHT_REFERENCE (the caller is warned). */
  heightReference?: CoefficientsHeightReference | undefined;
}

/** Site and epoch a mapping function is prepared for. */
export interface MappingContext {
  /** Geodetic latitude [rad]. */
  latitudeRad: number;
  /**
   * Height of the site above mean sea level, H [m] (orthometric: the API's ellipsoidal height minus
   * the geoid undulation, geometry/geoid.ts). Niell's height correction uses it in km.
   */
  heightM: number;
  /** Fractional day of year in UTC, 1 January 00:00 = 1.0 [d]. */
  dayOfYear: number;
  coefficients?: MappingCoefficients | undefined;
}

/** A mapping function evaluated for one site and epoch. */
export interface MappingEvaluator {
  /** @param elevationRad vacuum elevation [rad], (0, π/2] @returns hydrostatic mapping factor [-] */
  hydrostatic(elevationRad: number): number;
  /** @param elevationRad vacuum elevation [rad], (0, π/2] @returns wet mapping factor [-] */
  wet(elevationRad: number): number;
  /**
   * Both factors for a batch: outHydrostatic[i], outWet[i] at elevationsRad[i] [rad], (0, π/2], given
   * sinElevations[i] = Math.sin(elevationsRad[i]) [-] (elevationSines(): computed once per direction and
   * shared with the gradient model, GradientModel.mapBatch). A model uses sinElevations[i] wherever its
   * single form calls Math.sin(e), so that the batch gives the same bits.
   * Each model writes this loop in its own module, so that the calls inside it always meet the same
   * function: one shared loop calling `hydrostatic`/`wet` of whichever model came in would become a
   * polymorphic call site once a second model has run in the process, and lose V8's inlining (the
   * batch routes measured 2× slower after all models had run).
   */
  mapBatch(elevationsRad: ArrayLike<number>, sinElevations: Float64Array, outHydrostatic: Float64Array, outWet: Float64Array): void;
}

export interface MappingModel {
  /** API key, e.g. "niell". */
  key: string;
  /** Short citation that goes into a result's model description. */
  citation: string;
  /** True when the caller must send `coefficients`. */
  requiresCoefficients: boolean;
  prepare(context: MappingContext): MappingEvaluator;
  /**
   * The hydrostatic height correction this model applies for these coefficients, as it appears in a
   * result's `models` (key `mapping_height_correction`): "none" or the method and the height it uses.
   */
  heightCorrection(coefficients?: MappingCoefficients): string;
}
