/**
 * The mapping functions the service offers, by API key. A new model is one file exporting a
 * MappingModel plus one line here.
 */

import { chaoModel } from './chao.js';
import { cosecantModel } from './cosecant.js';
import { niellModel } from './niell.js';
import type { MappingModel } from './types.js';
import { vmf1Model } from './vmf1.js';

export const MAPPING_MODELS = {
  niell: niellModel,
  vmf1: vmf1Model,
  chao: chaoModel,
  cosecant: cosecantModel,
} as const satisfies Record<string, MappingModel>;

export type MappingModelKey = keyof typeof MAPPING_MODELS;
export const MAPPING_MODEL_KEYS = Object.keys(MAPPING_MODELS) as [MappingModelKey, ...MappingModelKey[]];
export const DEFAULT_MAPPING_MODEL: MappingModelKey = 'niell';
