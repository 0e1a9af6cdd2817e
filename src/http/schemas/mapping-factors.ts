import { z } from 'zod';
import { DEFAULT_MAPPING_MODEL } from '../../domain/mapping/registry.js';
import { DEFAULT_GRADIENT_MODEL } from '../../domain/gradients/gradient-mapping.js';
import { MAPPING_MODELS, type MappingModelKey } from '../../domain/mapping/registry.js';
import {
  elevationDeg,
  epochSchema,
  gradientModelSchema,
  mappingModelSchema,
  provenanceFields,
  siteSchema,
  vmf1CoefficientsSchema,
  sizedArray,
  geoidUndulationField,
  strictObject,
} from './common.js';

export const MAX_BATCH = 100_000;

/** coefficients are needed by, and only by, the models of the registry that require them. */
export function checkCoefficients(value: { model: MappingModelKey; coefficients?: unknown }, ctx: z.RefinementCtx): void {
  const required = MAPPING_MODELS[value.model].requiresCoefficients;
  if (required && value.coefficients === undefined) {
    ctx.addIssue({ code: 'custom', path: ['coefficients'], message: `model "${value.model}" needs coefficients {ah, aw}` });
  }
  if (!required && value.coefficients !== undefined) {
    ctx.addIssue({ code: 'custom', path: ['coefficients'], message: `model "${value.model}" takes no coefficients; they are for vmf1` });
  }
}

export const mappingFactorsRequest = strictObject({
  site: siteSchema,
  epoch: epochSchema,
  elevations_deg: sizedArray(
    z.array(elevationDeg(), { error: 'must be an array of elevations in (0, 90] deg' }),
    MAX_BATCH,
    'elevations',
  ).describe(`Vacuum elevations [deg], (0, 90], 1..${MAX_BATCH} of them`),
  model: mappingModelSchema.default(DEFAULT_MAPPING_MODEL),
  coefficients: vmf1CoefficientsSchema.optional(),
  gradient_model: gradientModelSchema.default(DEFAULT_GRADIENT_MODEL),
});

export const mappingFactorsResponse = z.object({
  model: z.string(),
  hydrostatic: z.array(z.number()).describe('Hydrostatic mapping factors [-], in the order of elevations_deg'),
  wet: z.array(z.number()).describe('Wet mapping factors [-]'),
  gradient: z.array(z.number()).describe('Gradient mapping factors [-]'),
  geoid_undulation_m: geoidUndulationField,
  ...provenanceFields,
});
