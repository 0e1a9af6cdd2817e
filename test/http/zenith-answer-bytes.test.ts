/**
 * POST /v1/zenith-delays writes its answer as text (src/http/routes/zenith-delays.ts zenithAnswerJson) instead of
 * JSON.stringify of an object. The reference is the object the route built before (de-facto the previous answer,
 * keys in the same order) passed through JSON.stringify: over a sweep of sites, partial met and wet models the
 * bytes and the content type are equal (common practice for a rewritten serialiser: byte-for-byte against the old one).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { aprioriZenithDelays, type AprioriZenith } from '../../src/domain/zenith/apriori.js';
import { provenance } from '../../src/domain/provenance.js';
import { WET_MODEL_KEYS } from '../../src/domain/zenith/wet.js';
import { zenithAnswerJson } from '../../src/http/routes/zenith-delays.js';
import { zenithDelaysResponse } from '../../src/http/schemas/zenith-delays.js';
import { toMetInput, toSite, zenithProvenance } from '../../src/http/routes/shared.js';
import { metUnitWarnings } from '../../src/http/tasks/apriori-batch.js';
import { useApp } from '../helpers/app.js';

interface Body {
  site: { latitude_deg: number; longitude_deg: number; height_m: number };
  epoch: string;
  met?: Record<string, number>;
  wet_model?: string;
}

/** The answer as the route built it before, field by field, for JSON.stringify. */
function previousAnswer(body: Body) {
  const wet = body.wet_model ?? 'saastamoinen';
  const z = aprioriZenithDelays(toSite(body.site), toMetInput(body.met), wet);
  return {
    zhd_m: z.zhdM,
    zwd_m: z.zwdM,
    ztd_m: z.ztdM,
    met_used: {
      pressure_hpa: z.met.pressureHpa,
      temperature_c: z.met.temperatureC,
      vapour_pressure_hpa: z.met.vapourPressureHpa,
      source: z.met.source,
    },
    geoid_undulation_m: z.geoidUndulationM,
    ...provenance(zenithProvenance(wet)),
    warnings: [...metUnitWarnings(body.met), ...z.met.warnings],
  };
}

const number = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
const metArbitrary = fc.record(
  {
    pressure_hpa: number(300, 1100),
    temperature_c: number(-90, 60),
    relative_humidity_pct: fc.oneof(number(0, 100), fc.constantFrom(0.61, 1)), // 0–1: the percent-unit warning
    height_m: number(-500, 9000),
  },
  { requiredKeys: [] },
);
const bodyArbitrary = fc.record(
  {
    site: fc.record({ latitude_deg: number(-90, 90), longitude_deg: number(-180, 360), height_m: number(-500, 9000) }),
    epoch: fc.constant('2026-06-21T06:30:00Z'),
    met: metArbitrary,
    wet_model: fc.constantFrom(...WET_MODEL_KEYS),
  },
  { requiredKeys: ['site', 'epoch'] },
);

describe('zenith-delays answer bytes against JSON.stringify of the previous answer object (common practice)', () => {
  const api = useApp();

  it('equal bytes and content type over a sweep of sites, partial met and wet models', async () => {
    let compared = 0;
    await fc.assert(
      fc.asyncProperty(bodyArbitrary, async (body) => {
        const r = await api().post('/v1/zenith-delays').send(body);
        if (r.status !== 200) return; // a combination the model refuses (422) is not this test's business
        expect(r.headers['content-type']).toBe('application/json; charset=utf-8');
        expect(r.text).toBe(JSON.stringify(previousAnswer(body)));
        // The writer is a second spelling of the response schema: a field the schema gains or loses without
        // the writer following fails here (strict: no key the schema does not know, every required one there).
        expect(zenithDelaysResponse.strict().safeParse(JSON.parse(r.text)).success).toBe(true);
        compared++;
      }),
      { numRuns: 300, seed: 20261205 },
    );
    expect(compared).toBeGreaterThan(200); // 246 of the 300 with this seed
  });

  it('writes numbers and strings as JSON.stringify does: -0, non-finite as null, escapes in warnings', () => {
    const z: AprioriZenith = {
      zhdM: -0,
      zwdM: Number.NaN,
      ztdM: Number.POSITIVE_INFINITY,
      met: {
        pressureHpa: 1e21,
        temperatureC: 5e-324,
        vapourPressureHpa: -1.5e-7,
        source: { pressure: 'measured', temperature: 'reduced', humidity: 'standard-atmosphere' },
        warnings: [],
      } as unknown as AprioriZenith['met'],
      geoidUndulationM: Number.NEGATIVE_INFINITY,
    };
    const prov = provenance({ a: 'x "quoted" \\ \u0001', b: 'ünï ☂ \ud800' });
    const warnings = ['a "quote", a backslash \\, a newline\n, a lone surrogate \udc00'];
    const expected = JSON.stringify({
      zhd_m: z.zhdM,
      zwd_m: z.zwdM,
      ztd_m: z.ztdM,
      met_used: { pressure_hpa: 1e21, temperature_c: 5e-324, vapour_pressure_hpa: -1.5e-7, source: z.met.source },
      geoid_undulation_m: z.geoidUndulationM,
      ...prov,
      warnings,
    });
    expect(zenithAnswerJson(z, JSON.stringify(prov).slice(1, -1), warnings)).toBe(expected);
  });
});
