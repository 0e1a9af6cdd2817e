/**
 * THE table of ZWD-estimation options: every option once, with its type, default, range, unit,
 * description and role in the fingerprint. From it are derived
 *   - the JSON schema of `options` and the query parameters of a text/csv request
 *     (src/http/schemas/zwd-estimates.ts), for both estimation routes and the station routes;
 *   - the domain options (`ZwdOptionValues`, camelCase) and the estimator's options
 *     (toEstimatorOptions, src/services/zwd-estimation.ts);
 *   - the `models` of a result and so its `model_fingerprint` (optionModels);
 *   - the option list of docs/zwd-estimation.md (optionsMarkdown, between markers; a test fails
 *     when the file is stale).
 * Adding an option: one entry here (plus, when the estimator gets a new setting, its use in
 * toEstimatorOptions and src/estimation).
 *
 * Names: `name` is the key in the JSON `options` (inside `options.gradients` for group
 * "gradients"); `flatName` is the query parameter of a text/csv request and the key in `models`.
 * Units: the API's units (s, m, m/√h, deg); `key` is the domain name with the same unit in it.
 */

import { MAX_INTERVAL_S, MAX_MET_GAP_S } from '../limits.js';
import { MAPPING_MODEL_KEYS } from '../domain/mapping/registry.js';
import { MIN_EPOCH_STATE_WINDOW_S, MIN_REJECTION_WINDOW_INTERVALS, MIN_REJECTION_WINDOW_S } from '../estimation/outliers.js';

export const WEIGHTING_SCHEMES = ['elevation', 'uniform', 'elevation-components'] as const;
export const PARAMETRISATIONS = ['every-epoch', 'nodes'] as const;
/** Wet mapping functions of the estimator: every model of the registry (vmf1 with the request's vmf1_coefficients). */
export const WET_MAPPING_MODELS = MAPPING_MODEL_KEYS as unknown as readonly [string, ...string[]];
export const OUTLIER_REJECTION_MODES = ['one-per-window', 'one-per-solution'] as const;

interface OptionCommon {
  /** Domain key (camelCase, unit in the name). */
  key: string;
  /** Key in the JSON `options` (or in `options.gradients`). */
  name: string;
  /** text/csv query parameter, and key in `models`. */
  flatName: string;
  group?: 'gradients';
  unit: string;
  description: string;
  /**
   * "setting": the value enters `models` under flatName, and so the fingerprint: two results are
   * comparable only when every setting is equal. (Every option today is a setting.)
   */
  fingerprint: 'setting';
}

export interface NumberOptionSpec extends OptionCommon {
  type: 'number' | 'integer';
  min: number;
  max: number;
  minExclusive?: boolean;
  maxExclusive?: boolean;
  /** null is allowed and means what this says (e.g. "no constraint"). */
  nullMeans?: string;
  default: number | null;
}

export interface BooleanOptionSpec extends OptionCommon {
  type: 'boolean';
  default: boolean;
}

export interface EnumOptionSpec extends OptionCommon {
  type: 'enum';
  values: readonly [string, ...string[]];
  default: string;
  /** The value as recorded in `models` (default: the value itself). */
  modelText?: (value: string) => string;
}

export type OptionSpec = NumberOptionSpec | BooleanOptionSpec | EnumOptionSpec;

/** The group switch: gradients on (an object of the group's options) or off (null / gradients=off). */
export const GRADIENTS_GROUP = {
  name: 'gradients',
  default: true,
  description:
    'Horizontal gradients G_N, G_E (Chen & Herring 1997 mapping), random walks like the ZWD; null (text/csv: gradients=off) = not estimated',
} as const;

export const ZWD_OPTIONS = [
  {
    key: 'zwdIntervalS',
    name: 'zwd_interval_s',
    flatName: 'zwd_interval_s',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: MAX_INTERVAL_S,
    default: 300,
    unit: 's',
    description:
      'Spacing Δ of the ZWD nodes of the output, on round UTC epochs jΔ (multiples of Δ since 1970-01-01T00:00Z); with parametrisation "nodes" also the spacing of the piecewise-linear model',
    fingerprint: 'setting',
  },
  {
    key: 'zwdRandomWalkMPerSqrtH',
    name: 'zwd_random_walk_m_per_sqrt_h',
    flatName: 'zwd_random_walk_m_per_sqrt_h',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: 10,
    nullMeans: 'no constraint',
    default: 0.01,
    unit: 'm/√h',
    description: 'Random-walk density q of the ZWD: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h) (states at every epoch, or nodes)',
    fingerprint: 'setting',
  },
  {
    key: 'zwdAprioriSigmaM',
    name: 'zwd_apriori_sigma_m',
    flatName: 'zwd_apriori_sigma_m',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: 10,
    nullMeans: 'none',
    default: 0.5,
    unit: 'm',
    description: 'A-priori constraint on the first ZWD node, x_0 = 0 ± σ',
    fingerprint: 'setting',
  },
  {
    key: 'gradientIntervalS',
    name: 'interval_s',
    flatName: 'gradient_interval_s',
    group: 'gradients',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: MAX_INTERVAL_S,
    default: 21_600,
    unit: 's',
    description: 'Spacing of the gradient nodes of the output (round UTC epochs; with parametrisation "nodes" the model\'s nodes)',
    fingerprint: 'setting',
  },
  {
    key: 'gradientRandomWalkMPerSqrtH',
    name: 'random_walk_m_per_sqrt_h',
    flatName: 'gradient_random_walk_m_per_sqrt_h',
    group: 'gradients',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: 10,
    nullMeans: 'no constraint',
    default: 0.001,
    unit: 'm/√h',
    description: 'Random-walk density q of each gradient component: consecutive states x_{j+1} − x_j = 0 ± q √(Δt/1 h)',
    fingerprint: 'setting',
  },
  {
    key: 'gradientAprioriSigmaM',
    name: 'apriori_sigma_m',
    flatName: 'gradient_apriori_sigma_m',
    group: 'gradients',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: 1,
    nullMeans: 'none',
    default: 0.01,
    unit: 'm',
    description: 'A-priori constraint on the first gradient node, x_0 = 0 ± σ',
    fingerprint: 'setting',
  },
  {
    key: 'epochBias',
    name: 'epoch_bias',
    flatName: 'epoch_bias',
    type: 'boolean',
    default: true,
    unit: '',
    description: 'Estimate one free bias per epoch (receiver clock and other common terms); pre-eliminated',
    fingerprint: 'setting',
  },
  {
    key: 'weighting',
    name: 'weighting',
    flatName: 'weighting',
    type: 'enum',
    values: WEIGHTING_SCHEMES,
    default: 'elevation',
    unit: '',
    description:
      'σ_i of observations without sigma_m, σ² = a² + b²/sin²e: "elevation" b = sigma0_m, a = 0; "uniform" a = sigma0_m, b = 0; "elevation-components" b = sigma0_m and a = sigma_constant_m (both re-estimated with scale_sigmas)',
    fingerprint: 'setting',
  },
  {
    key: 'sigma0M',
    name: 'sigma0_m',
    flatName: 'sigma0_m',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: 1,
    default: 0.003,
    unit: 'm',
    description: 'σ0 of the weighting scheme (zenith standard deviation of a residual)',
    fingerprint: 'setting',
  },
  {
    key: 'elevationCutoffDeg',
    name: 'elevation_cutoff_deg',
    flatName: 'elevation_cutoff_deg',
    type: 'number',
    min: 0,
    max: 90,
    maxExclusive: true,
    default: 7,
    unit: 'deg',
    description: 'Observations below this elevation are dropped (and counted)',
    fingerprint: 'setting',
  },
  {
    key: 'outlierThreshold',
    name: 'outlier_threshold',
    flatName: 'outlier_threshold',
    type: 'number',
    min: 2,
    max: 1000,
    nullMeans: 'no screening',
    default: 4,
    unit: '',
    description: 'Reject while the largest |normalised residual| (Pope τ = v/(σ̂0 σ_v)) exceeds k',
    fingerprint: 'setting',
  },
  {
    key: 'outlierRejection',
    name: 'outlier_rejection',
    flatName: 'outlier_rejection',
    type: 'enum',
    values: OUTLIER_REJECTION_MODES,
    default: 'one-per-window',
    modelText: (v: string) =>
      v === 'one-per-window'
        ? `one-per-window (nodes: max(${MIN_REJECTION_WINDOW_INTERVALS} intervals, ${MIN_REJECTION_WINDOW_S} s); every-epoch: smoother kernel length, ${MIN_EPOCH_STATE_WINDOW_S}-${MIN_REJECTION_WINDOW_S} s)`
        : v,
    unit: '',
    description:
      'one-per-solution: reject the largest τ > k, re-solve, repeat. one-per-window: in each iteration also reject the largest τ > k of every stretch more than a window away from the others (nodes: max(3 ZWD intervals, 30 min); every-epoch: the smoother kernel length, 5–30 min; same result at a cost linear in the span)',
    fingerprint: 'setting',
  },
  {
    key: 'maxRejections',
    name: 'max_rejections',
    flatName: 'max_rejections',
    type: 'integer',
    min: 0,
    max: 100_000,
    default: 1000,
    unit: '',
    description: 'Screening stops after this many rejections, with a warning',
    fingerprint: 'setting',
  },
  {
    key: 'scaleSigmas',
    name: 'scale_sigmas',
    flatName: 'scale_sigmas',
    type: 'boolean',
    default: true,
    unit: '',
    description:
      'Re-estimate the observation weights from the residuals (variance components: σ0, or a and b of "elevation-components") and solve again; the random-walk and a-priori constraints keep their sigmas. false = the weights as given',
    fingerprint: 'setting',
  },
  {
    key: 'sigmaConstantM',
    name: 'sigma_constant_m',
    flatName: 'sigma_constant_m',
    type: 'number',
    min: 0,
    max: 1,
    nullMeans: 'sigma0_m / 3',
    default: null,
    unit: 'm',
    description:
      'a of weighting "elevation-components" (σ² = a² + b²/sin²e), the starting value when scale_sigmas re-estimates it; ignored by the other schemes',
    fingerprint: 'setting',
  },
  {
    key: 'parametrisation',
    name: 'parametrisation',
    flatName: 'parametrisation',
    type: 'enum',
    values: PARAMETRISATIONS,
    default: 'every-epoch',
    unit: '',
    description:
      'every-epoch: a random-walk state of ZWD and gradients at every epoch, nodes interpolated with the Brownian-bridge variance (formal errors hold at any node spacing). nodes: piecewise linear between the nodes (the variation between nodes is not in σ)',
    fingerprint: 'setting',
  },
  {
    key: 'correlatedNoise',
    name: 'correlated_noise',
    flatName: 'correlated_noise',
    type: 'boolean',
    default: true,
    unit: '',
    description:
      'Estimate the residuals\' time correlation per satellite arc and inflate the formal errors by it (docs/zwd-estimation.md, "Formal errors")',
    fingerprint: 'setting',
  },
  {
    key: 'wetMapping',
    name: 'wet_mapping',
    flatName: 'wet_mapping',
    type: 'enum',
    values: WET_MAPPING_MODELS,
    default: 'niell',
    unit: '',
    description:
      "Wet mapping function of the estimator (src/domain/mapping registry). vmf1 needs per-epoch coefficients in the JSON body's vmf1_coefficients [{epoch, a_h, a_w}], interpolated linearly in time and spanning every observation epoch (a text/csv request cannot carry them)",
    fingerprint: 'setting',
  },
  {
    key: 'metMaxGapS',
    name: 'met_max_gap_s',
    flatName: 'met_max_gap_s',
    type: 'number',
    min: 0,
    minExclusive: true,
    max: MAX_MET_GAP_S,
    default: 10_800,
    unit: 's',
    description: 'Longest gap between met records that is interpolated across (the same setting as met_max_gap_s of the station PWV route)',
    fingerprint: 'setting',
  },
] as const satisfies readonly OptionSpec[];

type Spec = (typeof ZWD_OPTIONS)[number];
type ValueOf<S> = S extends { type: 'boolean' }
  ? boolean
  : S extends { type: 'enum'; values: readonly (infer V)[] }
    ? V
    : S extends { nullMeans: string }
      ? number | null
      : number;

/** The options in domain shape: one value per table entry (by `key`), and the gradients switch. */
export type ZwdOptionValues = { [S in Spec as S['key']]: ValueOf<S> } & { gradients: boolean };

/** Every option at its default. */
export const DEFAULT_ZWD_OPTIONS: ZwdOptionValues = Object.fromEntries([
  ...ZWD_OPTIONS.map((s) => [s.key, s.default]),
  ['gradients', GRADIENTS_GROUP.default],
]) as ZwdOptionValues;

/** One option's value by its spec. */
export const optionValue = (values: ZwdOptionValues, spec: OptionSpec): number | boolean | string | null =>
  (values as unknown as Record<string, number | boolean | string | null>)[spec.key]!;

/**
 * The settings part of `models`: every "setting" under its flatName; options of the gradient group
 * are null when gradients are off.
 */
export function optionModels(values: ZwdOptionValues): Record<string, number | boolean | string | null> {
  const out: Record<string, number | boolean | string | null> = {};
  for (const spec of ZWD_OPTIONS as readonly OptionSpec[]) {
    if (spec.fingerprint !== 'setting') continue;
    const v = spec.group === 'gradients' && !values.gradients ? null : optionValue(values, spec);
    out[spec.flatName] = spec.type === 'enum' && spec.modelText && typeof v === 'string' ? spec.modelText(v) : v;
  }
  return out;
}

/** "[0, 90) deg", "(0, 2592000] s": the allowed range as a message and the docs write it. */
export function rangeText(spec: NumberOptionSpec): string {
  return `${spec.minExclusive ? '(' : '['}${spec.min}, ${spec.max}${spec.maxExclusive ? ')' : ']'} ${spec.unit}`.trim();
}

export const OPTIONS_DOC_BEGIN = '<!-- options table: generated from src/services/zwd-options.ts; do not edit by hand -->';
export const OPTIONS_DOC_END = '<!-- end of options table -->';

/** The option list of docs/zwd-estimation.md (Markdown table). */
export function optionsMarkdown(): string {
  const rows = (ZWD_OPTIONS as readonly OptionSpec[]).map((s) => {
    const json = s.group ? `options.${s.group}.${s.name}` : `options.${s.name}`;
    const type = s.type === 'enum' ? s.values.map((v) => `\`${v}\``).join(' \\| ') : s.type;
    const range = s.type === 'number' || s.type === 'integer' ? rangeText(s) + (s.nullMeans ? `; null = ${s.nullMeans}` : '') : '';
    const dflt = s.default === null ? 'null' : `\`${String(s.default)}\``;
    return `| \`${json}\` | \`${s.flatName}\` | ${type} | ${dflt} | ${range} | ${s.description.replace(/\|/g, '\\|')} | ${s.fingerprint} |`;
  });
  return [
    OPTIONS_DOC_BEGIN,
    '',
    `| JSON | text/csv query | type | default | range [unit] | meaning | fingerprint |`,
    `|---|---|---|---|---|---|---|`,
    `| \`options.gradients\` | \`gradients\` (\`on\`/\`off\`) | object or null | \`{}\` (on) |  | ${GRADIENTS_GROUP.description} | setting (gradient_* null when off) |`,
    ...rows,
    '',
    OPTIONS_DOC_END,
  ].join('\n');
}

/** `markdown` with the text between the option-table markers replaced by optionsMarkdown(). */
export function withOptionsTable(markdown: string): string {
  const begin = markdown.indexOf(OPTIONS_DOC_BEGIN);
  const end = markdown.indexOf(OPTIONS_DOC_END);
  if (begin < 0 || end < begin) throw new Error('the option-table markers are missing');
  return markdown.slice(0, begin) + optionsMarkdown() + markdown.slice(end + OPTIONS_DOC_END.length);
}
