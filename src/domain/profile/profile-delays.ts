/**
 * Delays, precipitable water, Tm and ray-traced mapping factors of an atmospheric profile: the
 * computation behind POST /v1/profile-delays, put together from the one-job files of this folder.
 *
 *   levels.ts      validate, convert heights and humidity, cut or extend the column at the site
 *   humidity-extension.ts  climatological humidity above the last level that carries it
 *   extension.ts   dry isothermal hydrostatic extension above the top
 *   shells.ts      thin spherical shells with refractivity (refractivity.ts, compressibility.ts)
 *   integrate.ts   ZHD (pressure form, gravity.ts), ZWD, PWV, Tm
 *   ray-trace.ts   rays at vacuum elevations, bending, mapping factors
 *
 * Mapping factors are slant delay / zenith delay of the same column: the hydrostatic factor is the
 * traced hydrostatic slant delay (with the bending term) over the traced zenith hydrostatic delay,
 * the wet factor the traced wet slant delay over the zenith wet delay. The reported hydrostatic slant
 * delay is that factor times `zhdM` (the pressure form), so that slant = factor × zenith holds for
 * the numbers in the response; it equals the traced slant delay whenever the profile's heights and
 * pressures are in hydrostatic balance (otherwise a warning says by how much they are not).
 */

import { DEG } from '../constants.js';
import { gaussianRadiusM } from '../geometry/earth-radius.js';
import { geoidUndulationM } from '../geometry/geoid.js';
import { MAPPING_MIN_ELEVATION_DEG, mappingDefinedAt } from '../mapping/elevation-range.js';
import type { MappingEvaluator } from '../mapping/types.js';
import { PER_N_UNIT } from './constants.js';
import { isothermalExtension } from './extension.js';
import type { HumidityExtension } from './humidity-extension.js';
import { gravityAtLatitude } from './gravity.js';
import { zenithIntegrals } from './integrate.js';
import { columnFromSite, validateLevels, type ProfileLevelInput } from './levels.js';
import { traceRay, traceToVacuumElevation } from './ray-trace.js';
import { DEFAULT_REFRACTIVITY_CONSTANTS, REFRACTIVITY_CONSTANT_SETS, type RefractivityConstantsKey } from './refractivity.js';
import { buildShellColumn } from './shells.js';

/**
 * Height over which vapour above the top is assumed to decay, for the missing-wet-delay warning [m]
 * (common practice: ~2 km vapour scale height).
 */
const VAPOUR_SCALE_HEIGHT_M = 2000;
/** Missing wet delay above the top that triggers a warning [m]. */
const MISSING_WET_WARNING_M = 0.5e-3;
/** Difference between the height and pressure forms of the ZHD that triggers a warning [m]. */
const HYDROSTATIC_BALANCE_WARNING_M = 1e-3;
/** Zenith wet delay below which a wet mapping factor is not defined (a dry column) [m]. */
const DRY_COLUMN_ZWD_M = 1e-7;

export interface ProfileDelaysInput {
  /** Geodetic latitude of the site [rad]. */
  latitudeRad: number;
  /** Site height above the ellipsoid [m]; the column starts here. */
  siteHeightM: number;
  levels: readonly ProfileLevelInput[];
  /**
   * Geoid undulation at the site [m], for geopotential heights; default: EGM96 at the site when
   * `longitudeRad` is given (geometry/geoid.ts), else 0 (with a warning).
   */
  geoidUndulationM?: number | undefined;
  /** Longitude of the site [rad], east positive; for the EGM96 undulation when none is given. */
  longitudeRad?: number | undefined;
  constants?: RefractivityConstantsKey | undefined;
  /** Include the compressibility factors of Owens (1967); default false. */
  compressibility?: boolean | undefined;
  /** Vacuum elevations to trace [rad], (0, π/2]. */
  elevationsRad?: readonly number[] | undefined;
  /** The mapping function to set beside the traced factors (Niell, VMF1, … prepared for site and epoch). */
  modelMapping?: MappingEvaluator | undefined;
  /** Shell spacing divisor (tests of convergence); default 1. */
  resolution?: number | undefined;
}

export interface SlantResult {
  elevationRad: number;
  apparentElevationRad: number;
  refractionRad: number;
  hydrostaticM: number;
  wetM: number;
  totalM: number;
  /** Geometric bending term, included in hydrostaticM [m]. */
  bendingM: number;
  mappingHydrostatic: number;
  mappingWet: number | null;
  modelMappingHydrostatic: number | null;
  modelMappingWet: number | null;
}

export interface ProfileDelaysResult {
  zhdM: number;
  zwdM: number;
  ztdM: number;
  pwvMm: number;
  tmK: number | null;
  zhdHeightIntegralM: number;
  meanGravityM_S2: number;
  topExtension: {
    topHeightM: number;
    topPressureHpa: number;
    topTemperatureK: number;
    scaleHeightM: number;
    ceilingHeightM: number;
    zhdM: number;
    zhdFraction: number;
  };
  column: {
    bottomHeightM: number;
    topHeightM: number;
    levelsUsed: number;
    levelsBelowSite: number;
    extendedDownM: number;
    shells: number;
    earthRadiusM: number;
    surfacePressureHpa: number;
    surfaceTemperatureK: number;
  };
  /** Set when measured humidity stopped below the top level (humidity-extension.ts); null otherwise. */
  humidityExtension: HumidityExtension | null;
  slants?: SlantResult[];
  warnings: string[];
}

export function computeProfileDelays(input: ProfileDelaysInput): ProfileDelaysResult {
  const warnings: string[] = [];
  const constants = REFRACTIVITY_CONSTANT_SETS[input.constants ?? DEFAULT_REFRACTIVITY_CONSTANTS];
  const gravity = gravityAtLatitude(input.latitudeRad);
  const earthRadiusM = gaussianRadiusM(input.latitudeRad);
  const firstHeightField = input.levels[0]?.heightM === undefined ? 'levels.0.geopotential_height_m' : 'levels.0.height_m';

  const geoidSource = input.geoidUndulationM !== undefined ? 'caller' : input.longitudeRad !== undefined ? 'egm96' : 'none';
  const undulationM =
    input.geoidUndulationM ?? (input.longitudeRad !== undefined ? geoidUndulationM(input.latitudeRad / DEG, input.longitudeRad / DEG) : 0);
  const levels = validateLevels(input.levels, gravity, undulationM, warnings, geoidSource);
  const column = columnFromSite(levels, input.siteHeightM, warnings, firstHeightField);
  const top = column.heightM.length - 1;
  const extension = isothermalExtension(
    column.heightM[top]!,
    column.pressureHpa[top]!,
    column.temperatureK[top]!,
    column.pressureHpa[0]!,
    gravity,
    input.resolution ?? 1,
  );
  const shells = buildShellColumn(column, extension, {
    constants,
    compressibility: input.compressibility ?? false,
    gravity,
    earthRadiusM,
    resolution: input.resolution ?? 1,
  });
  const zenith = zenithIntegrals(shells, constants);

  const topWetN = shells.wetN[shells.topNode - 1] ?? 0;
  const missingWetM = PER_N_UNIT * topWetN * VAPOUR_SCALE_HEIGHT_M;
  if (missingWetM > MISSING_WET_WARNING_M) {
    warnings.push(
      `vapour pressure at the top level is ${column.vapourPressureHpa[top]!.toPrecision(3)} hPa; the extension above the top is dry, so about ${(missingWetM * 1000).toFixed(1)} mm of wet delay above the top may be missing`,
    );
  }
  const balanceM = zenith.zhdHeightIntegralM - zenith.zhdM;
  if (Math.abs(balanceM) > HYDROSTATIC_BALANCE_WARNING_M) {
    warnings.push(
      `the hydrostatic delay integrated over the given heights (${zenith.zhdHeightIntegralM.toFixed(4)} m) differs from the pressure form (${zenith.zhdM.toFixed(4)} m) by ${(balanceM * 1000).toFixed(1)} mm: the heights and pressures are not in hydrostatic balance; zhd_m uses the pressures, mapping factors the heights`,
    );
  }

  let slants: SlantResult[] | undefined;
  if (input.elevationsRad && input.elevationsRad.length > 0) {
    const zenithTrace = traceRay(shells, Math.PI / 2)!;
    const zenithHydrostaticM = zenithTrace.hydrostaticExcessM + zenithTrace.bendingM;
    slants = input.elevationsRad.map((elevationRad, i) => {
      const trace = traceToVacuumElevation(shells, elevationRad, `elevations_deg.${i}`);
      const mappingHydrostatic = (trace.hydrostaticExcessM + trace.bendingM) / zenithHydrostaticM;
      const mappingWet = zenith.zwdM > DRY_COLUMN_ZWD_M ? trace.wetExcessM / zenith.zwdM : null;
      const hydrostaticM = mappingHydrostatic * zenith.zhdM;
      const mappingDefined = mappingDefinedAt(elevationRad / DEG);
      return {
        elevationRad,
        apparentElevationRad: trace.launchRad,
        refractionRad: trace.launchRad - elevationRad,
        hydrostaticM,
        wetM: trace.wetExcessM,
        totalM: hydrostaticM + trace.wetExcessM,
        bendingM: trace.bendingM,
        mappingHydrostatic,
        mappingWet,
        // Mapping functions are not evaluated below their floor (mapping/elevation-range.ts): null there.
        modelMappingHydrostatic: input.modelMapping && mappingDefined ? input.modelMapping.hydrostatic(elevationRad) : null,
        modelMappingWet: input.modelMapping && mappingDefined ? input.modelMapping.wet(elevationRad) : null,
      };
    });
    if (zenith.zwdM <= DRY_COLUMN_ZWD_M) warnings.push('the column is dry: wet mapping factors are not defined (null)');
    const belowFloor = input.modelMapping ? input.elevationsRad.filter((e) => !mappingDefinedAt(e / DEG)).length : 0;
    if (belowFloor > 0) {
      warnings.push(
        `${belowFloor} elevation(s) below ${MAPPING_MIN_ELEVATION_DEG}°: the mapping function is not evaluated there (model_mapping_hydrostatic and model_mapping_wet are null); the traced values stand`,
      );
    }
  }

  return {
    zhdM: zenith.zhdM,
    zwdM: zenith.zwdM,
    ztdM: zenith.zhdM + zenith.zwdM,
    pwvMm: zenith.pwvMm,
    tmK: zenith.tmK,
    zhdHeightIntegralM: zenith.zhdHeightIntegralM,
    meanGravityM_S2: zenith.meanGravityM_S2,
    topExtension: {
      topHeightM: column.heightM[top]!,
      topPressureHpa: column.pressureHpa[top]!,
      topTemperatureK: column.temperatureK[top]!,
      scaleHeightM: extension.scaleHeightM,
      ceilingHeightM: shells.heightM[shells.shells]!,
      zhdM: zenith.extensionZhdM,
      zhdFraction: zenith.extensionZhdM / zenith.zhdM,
    },
    column: {
      bottomHeightM: column.heightM[0]!,
      topHeightM: column.heightM[top]!,
      levelsUsed: column.levelsUsed,
      levelsBelowSite: column.levelsBelowSite,
      extendedDownM: column.extendedDownM,
      shells: shells.shells,
      earthRadiusM,
      surfacePressureHpa: column.pressureHpa[0]!,
      surfaceTemperatureK: column.temperatureK[0]!,
    },
    humidityExtension: levels.humidityExtension,
    ...(slants ? { slants } : {}),
    warnings,
  };
}
