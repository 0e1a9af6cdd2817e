/**
 * The many-station reads of the network route (readZenithDelaysMany, readSurfaceMetMany,
 * countDelaySources, latestEpochsMs) against the one-station reads of the repository contract, on
 * every backend: same rows, same order, per station.
 */

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { provenance } from '../../src/domain/provenance.js';
import { createRepository } from '../../src/storage/factory.js';
import type { DelayRow, Repository } from '../../src/storage/repository.js';
import { BACKENDS, ztdOnlyRow } from '../helpers/storage.js';

const T0 = Date.UTC(2026, 2, 1);
const MIN = 60_000;
const models = provenance({ test: 'network reads' });
const modelSet = { modelFingerprint: models.model_fingerprint, models: models.models };

const delay = (epochMs: number, source: string, ztdM: number): DelayRow => ztdOnlyRow(epochMs, source, ztdM, models.model_fingerprint);

for (const backend of BACKENDS) {
  describe(`many-station reads on ${backend.name}`, () => {
    let repo: Repository;
    let cleanup: () => Promise<void>;
    const ids = ['S1', 'S2', 'S3'];
    beforeAll(async () => {
      const fresh = await backend.fresh();
      cleanup = fresh.cleanup;
      repo = await createRepository(fresh.config);
      for (const [i, id] of ids.entries()) {
        await repo.putStation(id, { name: id, latitudeDeg: 10 * i, longitudeDeg: 5, heightM: 100, metHeightM: null, description: null });
        if (id === 'S3') continue; // no series
        const rows = Array.from({ length: 30 }, (_, k) => delay(T0 + k * 5 * MIN, 'a', 2.3 + 0.001 * k + i));
        rows.push(delay(T0 + 10 * MIN, 'b', 2.5), delay(T0 + 20 * MIN, 'b', 2.5));
        await repo.writeDelays(id, rows, modelSet);
        await repo.writeMet(
          id,
          [0, 1, 2].map((h) => ({
            epochMs: T0 + h * 3_600_000,
            source: 'm',
            pressureHpa: 1000 + h,
            temperatureC: 10 + i,
            relativeHumidityPct: null,
            dewpointC: null,
            vapourPressureHpa: null,
          })),
        );
      }
    });
    afterAll(async () => {
      await repo?.close();
      await cleanup?.();
    });

    it('readZenithDelaysMany gives per station what readZenithDelays gives, in order', async () => {
      const ranges = [
        { stationId: 'S2', fromMs: T0 + 10 * MIN, toMs: T0 + 60 * MIN },
        { stationId: 'S1', fromMs: T0, toMs: T0 + 20 * MIN },
        { stationId: 'S3', fromMs: T0, toMs: T0 + 60 * MIN },
      ];
      const many = await repo.readZenithDelaysMany(ranges);
      expect([...many.keys()].sort()).toEqual(['S1', 'S2']);
      for (const r of ranges.slice(0, 2)) expect(many.get(r.stationId)).toEqual(await repo.readZenithDelays(r.stationId, r));
      expect(many.get('S1')!.map((d) => `${(d.epochMs - T0) / MIN}${d.source}`)).toEqual(['0a', '5a', '10a', '10b', '15a', '20a', '20b']);
      const onlyB = await repo.readZenithDelaysMany(ranges, 'b');
      expect(onlyB.get('S2')!.map((d) => d.source)).toEqual(['b', 'b']);
    });

    it('readSurfaceMetMany gives per station what readSurfaceMet gives', async () => {
      const ranges = ids.map((stationId) => ({ stationId, fromMs: T0, toMs: T0 + 3_600_000 }));
      const many = await repo.readSurfaceMetMany(ranges);
      for (const id of ['S1', 'S2']) expect(many.get(id)).toEqual(await repo.readSurfaceMet(id, ranges[0]!));
      expect(many.has('S3')).toBe(false);
    });

    it('countDelaySources counts rows per source; latestEpochsMs the latest epoch per station', async () => {
      const counts = await repo.countDelaySources([{ stationId: 'S1', fromMs: T0, toMs: T0 + 86_400_000 }]);
      expect(Object.fromEntries(counts.get('S1')!)).toEqual({ a: 30, b: 2 });
      const latest = await repo.latestEpochsMs(ids, 'delays');
      expect(Object.fromEntries(latest)).toEqual({ S1: T0 + 29 * 5 * MIN, S2: T0 + 29 * 5 * MIN });
      expect(Object.fromEntries(await repo.latestEpochsMs(ids, 'met'))).toEqual({ S1: T0 + 2 * 3_600_000, S2: T0 + 2 * 3_600_000 });
    });
  });
}
