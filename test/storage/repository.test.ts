/**
 * The repository contract, run on every backend in BACKENDS (SQLite always; PostgreSQL when
 * TEST_DATABASE_URL or DATABASE_URL is set, as .ci/run does). The expectations are the contract
 * written in src/storage/repository.ts and the issue: keys (station, epoch, source), idempotent
 * re-sends, inclusive ranges, cascade on station deletion, transactions, durability across a reopen.
 */

import { afterEach, describe, expect, it } from 'vitest';
import { provenance } from '../../src/domain/provenance.js';
import { createRepository, type StorageConfig } from '../../src/storage/factory.js';
import { MIGRATIONS } from '../../src/storage/migrations.js';
import type { DelayRow, MetRow, Repository, StoredSounding } from '../../src/storage/repository.js';
import { UnknownStationError } from '../../src/storage/repository.js';
import { BACKENDS } from '../helpers/storage.js';
import { insideBox } from '../../src/http/routes/network-precipitable-water.js';

const T0 = Date.UTC(2026, 2, 14, 0, 0, 0);
const MIN = 60_000;

const STATION = {
  name: 'Quillmarsh Ridge (invented)',
  latitudeDeg: 47.25,
  longitudeDeg: 8.5,
  heightM: 512.3,
  metHeightM: 510.1,
  description: 'synthetic test station',
};

function met(i: number, source = 'sensor-a', pressureHpa = 950 + i * 0.1): MetRow {
  return {
    epochMs: T0 + i * 5 * MIN,
    source,
    pressureHpa,
    temperatureC: 12.5 + 0.01 * i,
    relativeHumidityPct: i % 2 ? 60 : null,
    dewpointC: null,
    vapourPressureHpa: null,
  };
}

const MODELS = provenance({ mapping: 'niell', cutoff_deg: 7, random_walk_m_per_sqrt_h: 0.01 });
const MODEL_SET = { modelFingerprint: MODELS.model_fingerprint, models: MODELS.models };

const SOUNDING_MODELS = provenance({ refractivity: 'bevis-1994', humidity_extension: 'smith-1966-power-law (lambda 3)' });
const SOUNDING_MODEL_SET = { modelFingerprint: SOUNDING_MODELS.model_fingerprint, models: SOUNDING_MODELS.models };

function sounding(i: number, pwvMm = 18.5 + i): StoredSounding {
  return {
    epochMs: T0 + i * 12 * 60 * MIN,
    zhdM: 2.21,
    zwdM: pwvMm * 0.0065,
    ztdM: 2.21 + pwvMm * 0.0065,
    pwvMm,
    tmK: i % 2 ? 271.4 : null,
    lastHumidityPressureHpa: i % 2 ? 400.5 : null,
    levels: 42 + i,
    warnings: i % 2 ? ['measured humidity stops at level 20'] : [],
    modelFingerprint: SOUNDING_MODEL_SET.modelFingerprint,
    storedAt: new Date(T0 + i).toISOString(),
    profileJson: JSON.stringify({ levels: [{ pressure_hpa: 1000 - i }] }),
  };
}

function delay(i: number, source = 'estimator', fingerprint = MODEL_SET.modelFingerprint): DelayRow {
  return {
    epochMs: T0 + i * 5 * MIN,
    source,
    ztdM: 2.3 + i * 1e-4,
    ztdSigmaM: 0.004,
    zwdM: i % 2 ? 0.12 : null,
    zwdSigmaM: null,
    northGradientM: -0.0003,
    eastGradientM: 0.0001,
    northGradientSigmaM: null,
    eastGradientSigmaM: null,
    modelFingerprint: fingerprint,
  };
}

for (const backend of BACKENDS) {
  describe(`repository contract on ${backend.name} (src/storage/repository.ts)`, () => {
    const opened: Repository[] = [];
    const cleanups: (() => Promise<void>)[] = [];
    afterEach(async () => {
      for (const r of opened.splice(0)) await r.close();
      for (const c of cleanups.splice(0)) await c();
    });
    async function fresh(): Promise<{ repo: Repository; config: StorageConfig }> {
      const { config, cleanup } = await backend.fresh();
      cleanups.push(cleanup);
      const repo = await createRepository(config);
      opened.push(repo);
      return { repo, config };
    }

    it('creates, replaces, lists and deletes stations', async () => {
      const { repo } = await fresh();
      expect(repo.backend).toBe(backend.name);
      const first = await repo.putStation('QMR-1', STATION);
      expect(first.created).toBe(true);
      expect(first.station).toMatchObject({ stationId: 'QMR-1', ...STATION });
      const second = await repo.putStation('QMR-1', { ...STATION, heightM: 513, description: null });
      expect(second.created).toBe(false);
      expect(second.station.heightM).toBe(513);
      expect(second.station.description).toBeNull();
      expect(second.station.createdAt).toBe(first.station.createdAt);
      await repo.putStation('ALD_2', { ...STATION, name: 'Aldervane (invented)', metHeightM: null });
      expect((await repo.listStations()).map((s) => s.stationId)).toEqual(['ALD_2', 'QMR-1']);
      expect(await repo.purgeStation('ALD_2')).toBe(true);
      expect(await repo.purgeStation('ALD_2')).toBe(false);
      expect(await repo.getStation('ALD_2')).toBeNull();
    });

    it('getStations: the named live stations by id; unknown, deleted and purged ids absent, an id given twice read once', async () => {
      const { repo } = await fresh();
      expect((await repo.getStations([])).size).toBe(0);
      for (const id of ['QMR-1', 'ALD_2', 'BRK3', 'DEL-4']) await repo.putStation(id, { ...STATION, name: `${id} (invented)` });
      expect(await repo.deleteStation('DEL-4', '2026-03-14T12:00:00.000Z')).toBe(true);
      const got = await repo.getStations(['BRK3', 'NOPE', 'QMR-1', 'DEL-4', 'QMR-1']);
      expect([...got.keys()].sort()).toEqual(['BRK3', 'QMR-1']);
      // The same stations getStation reads, field for field.
      expect(got.get('QMR-1')).toEqual(await repo.getStation('QMR-1'));
      expect(got.get('BRK3')).toEqual(await repo.getStation('BRK3'));
      // A soft-deleted station is absent, as from getStation and listStations; restored, it is back.
      expect(await repo.restoreStation('DEL-4')).toBe(true);
      expect([...(await repo.getStations(['DEL-4'])).keys()]).toEqual(['DEL-4']);
      expect(await repo.purgeStation('ALD_2')).toBe(true);
      expect((await repo.getStations(['ALD_2'])).size).toBe(0);
      // Ids are matched exactly (no case folding, no pattern).
      expect((await repo.getStations(['qmr-1', 'QMR-%', 'QMR_1'])).size).toBe(0);
    });

    it(
      'getStations of 40 000 ids in one call, more than SQLite binds as parameters (32 766), 1 200 of them stations',
      { timeout: 60_000 },
      async () => {
        const { repo } = await fresh();
        const stations = Array.from({ length: 1200 }, (_, i) => `S${String(i).padStart(5, '0')}`);
        for (const [i, id] of stations.entries()) await repo.putStation(id, { ...STATION, name: `${id} (invented)`, heightM: i });
        const ids = Array.from({ length: 40_000 }, (_, i) => (i % 33 === 0 && i / 33 < stations.length ? stations[i / 33]! : `U${i}`));
        expect(ids.filter((id) => id.startsWith('S'))).toHaveLength(1200);
        const got = await repo.getStations(ids);
        expect([...got.keys()].sort()).toEqual(stations);
        stations.forEach((id, i) => expect(got.get(id)!.heightM).toBe(i));
      },
    );

    it("listStationsInBox: the stations the network routes' insideBox keeps (the filter before, in JS), bounds and 180° included", async () => {
      const { repo } = await fresh();
      const lats = [-90, -45.5, 0, 10, 10.000001, 45, 89.9, 90];
      const lons = [-180, -179.5, -10, 0, 10, 179.9, 180, 190, 350, 359.9];
      const all = lats.flatMap((lat, i) => lons.map((lon, j) => ({ id: `G${i}_${j}`, lat, lon })));
      for (const g of all) await repo.putStation(g.id, { ...STATION, name: `${g.id} (invented)`, latitudeDeg: g.lat, longitudeDeg: g.lon });
      await repo.deleteStation('G3_4', '2026-03-14T12:00:00.000Z'); // (10, 10): inside most boxes, but deleted
      const boxes = [
        { westDeg: -10, southDeg: 0, eastDeg: 10, northDeg: 10 },
        { westDeg: 170, southDeg: -50, eastDeg: -170, northDeg: 50 }, // across 180°
        { westDeg: 179.9, southDeg: -90, eastDeg: -180, northDeg: 90 },
        { westDeg: -180, southDeg: -90, eastDeg: 180, northDeg: 90 },
        { westDeg: 0, southDeg: 10, eastDeg: 0, northDeg: 10 },
        { westDeg: 5, southDeg: 20, eastDeg: 6, northDeg: 30 }, // empty
      ];
      const live = (await repo.listStations()).filter((st) => st.stationId !== 'G3_4');
      expect(live).toHaveLength(all.length - 1);
      for (const box of boxes) {
        const expected = live.filter((st) => insideBox(st, box)).map((st) => st.stationId);
        const got = await repo.listStationsInBox(box);
        expect(got.map((st) => st.stationId)).toEqual(expected);
        expect(got).toEqual(live.filter((st) => insideBox(st, box)));
      }
      // By hand: the first box holds latitudes 0 and 10 at longitudes −10, 0, 10, 350 (= −10) and 359.9 (= −0.1), not the deleted (10, 10).
      expect((await repo.listStationsInBox(boxes[0]!)).map((st) => st.stationId)).toEqual([
        'G2_2',
        'G2_3',
        'G2_4',
        'G2_8',
        'G2_9',
        'G3_2',
        'G3_3',
        'G3_8',
        'G3_9',
      ]);
      expect((await repo.listStationsInBox(boxes[5]!)).length).toBe(0);
    });

    it('stores met rows keyed by (station, epoch, source): a re-send is idempotent, a change is an update', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      const rows = Array.from({ length: 25 }, (_, i) => met(i));
      expect(await repo.writeMet('QMR-1', rows)).toEqual({ inserted: 25, updated: 0, unchanged: 0 });
      expect(await repo.writeMet('QMR-1', rows)).toEqual({ inserted: 0, updated: 0, unchanged: 25 });
      const changed = [met(3, 'sensor-a', 999.9), met(25), met(3, 'sensor-b')];
      expect(await repo.writeMet('QMR-1', changed)).toEqual({ inserted: 2, updated: 1, unchanged: 0 });
      const all = await repo.readMet('QMR-1', { fromMs: T0, toMs: T0 + 200 * MIN });
      expect(all).toHaveLength(27);
      expect(all.filter((r) => r.epochMs === T0 + 15 * MIN).map((r) => [r.source, r.pressureHpa])).toEqual([
        ['sensor-a', 999.9],
        ['sensor-b', 950.3],
      ]);
      // Values come back exactly as stored (IEEE doubles, nulls kept).
      expect(all[0]).toEqual(met(0));
      expect(all[1]).toEqual(met(1));
    });

    it('reads an inclusive time range in epoch order, optionally of one source', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      await repo.writeMet('QMR-1', [met(4), met(2), met(0), met(1), met(3), met(2, 'sensor-b')]);
      const range = { fromMs: T0 + 5 * MIN, toMs: T0 + 15 * MIN };
      expect((await repo.readMet('QMR-1', range)).map((r) => [(r.epochMs - T0) / MIN, r.source])).toEqual([
        [5, 'sensor-a'],
        [10, 'sensor-a'],
        [10, 'sensor-b'],
        [15, 'sensor-a'],
      ]);
      expect((await repo.readMet('QMR-1', range, 'sensor-b')).map((r) => r.source)).toEqual(['sensor-b']);
      expect(await repo.readMet('OTHER', range)).toEqual([]);
      expect(await repo.latestEpochMs('QMR-1', 'met')).toBe(T0 + 20 * MIN);
      expect(await repo.latestEpochMs('QMR-1', 'delays')).toBeNull();
    });

    it('stores delay rows with their model set; the fingerprint leads back to the models', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      const rows = Array.from({ length: 12 }, (_, i) => delay(i));
      expect(await repo.writeDelays('QMR-1', rows, MODEL_SET)).toEqual({ inserted: 12, updated: 0, unchanged: 0 });
      expect(await repo.writeDelays('QMR-1', rows, MODEL_SET)).toEqual({ inserted: 0, updated: 0, unchanged: 12 });
      const other = provenance({ source: 'elsewhere' });
      const otherSet = { modelFingerprint: other.model_fingerprint, models: other.models };
      expect(await repo.writeDelays('QMR-1', [delay(2, 'estimator', otherSet.modelFingerprint)], otherSet)).toEqual({
        inserted: 0,
        updated: 1,
        unchanged: 0,
      });
      const back = await repo.readDelays('QMR-1', { fromMs: T0, toMs: T0 + 11 * 5 * MIN });
      expect(back).toHaveLength(12);
      expect(back[0]).toEqual(rows[0]);
      expect(back[1]).toEqual(rows[1]);
      expect(back[2]!.modelFingerprint).toBe(otherSet.modelFingerprint);
      const sets = await repo.readModelSets([MODEL_SET.modelFingerprint, otherSet.modelFingerprint, 'unknown']);
      expect(sets).toHaveLength(2);
      expect(sets.find((s) => s.modelFingerprint === MODEL_SET.modelFingerprint)!.models).toEqual(MODELS.models);
      // Recomputing the fingerprint from the stored models gives the stored fingerprint (src/domain/provenance.ts).
      for (const s of sets) expect(provenance(s.models).model_fingerprint).toBe(s.modelFingerprint);
    });

    it('reads the narrow PWV columns: the same rows, order and values as the full reads', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      await repo.writeMet('QMR-1', [met(3), met(0), met(1, 'sensor-a', 951.25), met(1, 'sensor-b'), { ...met(2), pressureHpa: null }]);
      await repo.writeDelays('QMR-1', [delay(2), delay(0), { ...delay(1), ztdSigmaM: null }, delay(1, 'second')], MODEL_SET);
      const range = { fromMs: T0, toMs: T0 + 10 * MIN };
      const pickMet = ({ epochMs, source, pressureHpa, temperatureC }: MetRow) => ({ epochMs, source, pressureHpa, temperatureC });
      const pickDelay = ({ epochMs, source, ztdM, ztdSigmaM, modelFingerprint }: DelayRow) => ({
        epochMs,
        source,
        ztdM,
        ztdSigmaM,
        modelFingerprint,
      });
      expect(await repo.readSurfaceMet('QMR-1', range)).toEqual((await repo.readMet('QMR-1', range)).map(pickMet));
      expect(await repo.readSurfaceMet('QMR-1', range, 'sensor-b')).toEqual((await repo.readMet('QMR-1', range, 'sensor-b')).map(pickMet));
      expect(await repo.readZenithDelays('QMR-1', range)).toEqual((await repo.readDelays('QMR-1', range)).map(pickDelay));
      expect(await repo.readZenithDelays('QMR-1', range, 'second')).toEqual([pickDelay(delay(1, 'second'))]);
      expect(await repo.readSurfaceMet('QMR-1', range)).toHaveLength(4);
      expect(await repo.readZenithDelays('QMR-1', range)).toHaveLength(4);
    });

    it('paged reads (keyset): every page size gives the rows of the whole read, in order, none twice, pages split inside an epoch', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      await repo.putStation('QMR-2', STATION);
      // Three sources at epochs 0..6 (written out of order), one source only at 7; another station's rows beside them.
      const written = [7, 3, 0, 5, 1, 6, 2, 4].flatMap((i) => (i === 7 ? [met(i, 'b')] : [met(i, 'c'), met(i, 'a'), met(i, 'b')]));
      await repo.writeMet('QMR-1', written);
      await repo.writeMet('QMR-2', [met(2, 'a'), met(3, 'a')]);
      await repo.writeDelays('QMR-1', [delay(4, 'y'), delay(2, 'x'), delay(3, 'x'), delay(3, 'y')], MODEL_SET);
      // Expected (the contract: epoch then source, bounds inclusive): epochs 1..7 of QMR-1, sources in name order.
      const range = { fromMs: T0 + 5 * MIN, toMs: T0 + 35 * MIN };
      const expected = [1, 2, 3, 4, 5, 6].flatMap((i) => [met(i, 'a'), met(i, 'b'), met(i, 'c')]).concat([met(7, 'b')]);
      for (const pageRows of [1, 2, 3, 4, 19, 1000]) {
        const pages: MetRow[][] = [];
        for await (const page of repo.readPages('met', 'QMR-1', range, { pageRows })) pages.push(page);
        expect(pages.flat(), `pageRows ${pageRows}`).toEqual(expected);
        expect(pages.every((p) => p.length >= 1 && p.length <= pageRows)).toBe(true);
        expect(pages.length).toBe(Math.ceil(expected.length / pageRows));
      }
      const paged = async <K extends 'met' | 'surface-met' | 'delays' | 'zenith-delays'>(kind: K, source?: string) => {
        const rows = [];
        for await (const page of repo.readPages(kind, 'QMR-1', range, { pageRows: 2, source })) rows.push(...page);
        return rows;
      };
      expect(await paged('met', 'b')).toEqual([1, 2, 3, 4, 5, 6, 7].map((i) => met(i, 'b')));
      expect(await paged('surface-met')).toEqual(await repo.readSurfaceMet('QMR-1', range));
      expect(await paged('delays')).toEqual([delay(2, 'x'), delay(3, 'x'), delay(3, 'y'), delay(4, 'y')]);
      expect(await paged('zenith-delays', 'y')).toEqual(await repo.readZenithDelays('QMR-1', range, 'y'));
      expect(await paged('met', 'nobody')).toEqual([]);
    });

    it('refuses series for an unknown station and stores nothing', async () => {
      const { repo } = await fresh();
      await expect(repo.writeMet('NOPE', [met(0)])).rejects.toBeInstanceOf(UnknownStationError);
      await expect(repo.writeDelays('NOPE', [delay(0)], MODEL_SET)).rejects.toBeInstanceOf(UnknownStationError);
      expect(await repo.readModelSets([MODEL_SET.modelFingerprint])).toEqual([]);
    });

    it('a failed bulk write stores none of its rows (one transaction)', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      const rows = Array.from({ length: 50 }, (_, i) => delay(i));
      // The 40th row carries a fingerprint that is not its model set's: the write must fail whole.
      rows[40] = { ...rows[40]!, modelFingerprint: 'ffffffffffffffff' };
      await expect(repo.writeDelays('QMR-1', rows, MODEL_SET)).rejects.toThrow();
      expect(await repo.readDelays('QMR-1', { fromMs: 0, toMs: T0 * 2 })).toEqual([]);
    });

    it('purging a station deletes its met and delay series', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      await repo.putStation('KEEP', STATION);
      await repo.writeMet('QMR-1', [met(0), met(1)]);
      await repo.writeDelays('QMR-1', [delay(0)], MODEL_SET);
      await repo.writeMet('KEEP', [met(0)]);
      expect(await repo.purgeStation('QMR-1')).toBe(true);
      await repo.putStation('QMR-1', STATION);
      const all = { fromMs: 0, toMs: T0 * 2 };
      expect(await repo.readMet('QMR-1', all)).toEqual([]);
      expect(await repo.readDelays('QMR-1', all)).toEqual([]);
      expect(await repo.readMet('KEEP', all)).toHaveLength(1);
    });

    it('keeps everything across a close and reopen of the same storage (restart)', async () => {
      const { repo, config } = await fresh();
      await repo.putStation('QMR-1', STATION);
      await repo.writeMet(
        'QMR-1',
        Array.from({ length: 100 }, (_, i) => met(i)),
      );
      await repo.writeDelays(
        'QMR-1',
        Array.from({ length: 10 }, (_, i) => delay(i)),
        MODEL_SET,
      );
      await repo.close();
      opened.splice(opened.indexOf(repo), 1);
      const again = await createRepository(config); // migrations are not re-applied
      opened.push(again);
      expect(await again.getStation('QMR-1')).toMatchObject(STATION);
      expect(await again.readMet('QMR-1', { fromMs: 0, toMs: T0 * 2 })).toHaveLength(100);
      expect(await again.readDelays('QMR-1', { fromMs: 0, toMs: T0 * 2 })).toHaveLength(10);
    });

    it('bulk-writes 20 000 rows in one call (chunked binding on PostgreSQL)', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      const rows = Array.from({ length: 20_000 }, (_, i) => met(i));
      expect(await repo.writeMet('QMR-1', rows)).toEqual({ inserted: 20_000, updated: 0, unchanged: 0 });
      const back = await repo.readMet('QMR-1', { fromMs: T0, toMs: T0 + 19_999 * 5 * MIN });
      expect(back).toHaveLength(20_000);
      expect(back[19_999]).toEqual(rows[19_999]);
    });

    // Counts of a write larger than one statement's batch (SQLite: UPSERT_BATCH_ROWS = 256 rows per
    // upsert; PostgreSQL: one unnest chunk), with another source's rows inside the written epoch range
    // and the rows sent out of key order. The expected counts follow from how the rows were built
    // (common practice: the contract of WriteCounts in src/storage/repository.ts).
    it('counts inserted / updated / unchanged exactly in a 600-row write mixing all three, beside another source', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      const stored = Array.from({ length: 600 }, (_, i) => delay(i));
      const other = Array.from({ length: 300 }, (_, i) => delay(2 * i + 1, 'other'));
      expect(await repo.writeDelays('QMR-1', [...stored, ...other], MODEL_SET)).toEqual({ inserted: 900, updated: 0, unchanged: 0 });
      // i = 300..449 changed by 1 mm, 450..599 as stored, 600..899 new; sent newest first.
      const sent = Array.from({ length: 600 }, (_, k) => {
        const i = 300 + k;
        return i < 450 ? { ...delay(i), ztdM: delay(i).ztdM + 0.001 } : delay(i);
      }).reverse();
      expect(await repo.writeDelays('QMR-1', sent, MODEL_SET)).toEqual({ inserted: 300, updated: 150, unchanged: 150 });
      expect(await repo.writeDelays('QMR-1', sent, MODEL_SET)).toEqual({ inserted: 0, updated: 0, unchanged: 600 });
      const all = { fromMs: 0, toMs: T0 * 2 };
      const back = await repo.readDelays('QMR-1', all, 'estimator');
      expect(back).toHaveLength(900);
      expect(back[299]).toEqual(delay(299));
      expect(back[300]!.ztdM).toBe(delay(300).ztdM + 0.001);
      expect(back[899]).toEqual(delay(899));
      expect(await repo.readDelays('QMR-1', all, 'other')).toEqual(other);

      const metStored = Array.from({ length: 400 }, (_, i) => met(i));
      expect(await repo.writeMet('QMR-1', [...metStored, met(1, 'sensor-b')])).toEqual({ inserted: 401, updated: 0, unchanged: 0 });
      const metSent = Array.from({ length: 400 }, (_, k) => (k < 100 ? met(200 + k, 'sensor-a', 900) : met(200 + k))).reverse();
      expect(await repo.writeMet('QMR-1', metSent)).toEqual({ inserted: 200, updated: 100, unchanged: 100 });
      expect(await repo.readMet('QMR-1', all, 'sensor-a')).toHaveLength(600);
    });

    it('stores, replaces, lists by range, reads back with the profile and deletes soundings; a station deletion removes them', async () => {
      const { repo } = await fresh();
      await repo.putStation('QMR-1', STATION);
      await repo.putStation('QMR-2', STATION);
      for (const i of [2, 0, 1, 3]) expect(await repo.putSounding('QMR-1', sounding(i), SOUNDING_MODEL_SET)).toEqual({ created: true });
      await repo.putSounding('QMR-2', sounding(1, 99), SOUNDING_MODEL_SET);
      expect(await repo.putSounding('QMR-1', sounding(1, 21.25), SOUNDING_MODEL_SET)).toEqual({ created: false });
      // Inclusive range over soundings 1..2, ordered by epoch, without the profile.
      const listed = await repo.readSoundings('QMR-1', { fromMs: sounding(1).epochMs, toMs: sounding(2).epochMs });
      const { profileJson: _p1, ...one } = sounding(1, 21.25);
      const { profileJson: _p2, ...two } = sounding(2);
      expect(listed).toEqual([one, two]);
      expect(await repo.getSounding('QMR-1', sounding(1).epochMs)).toEqual(sounding(1, 21.25));
      expect(await repo.getSounding('QMR-1', sounding(1).epochMs + 1)).toBeNull();
      expect(await repo.readModelSets([SOUNDING_MODEL_SET.modelFingerprint])).toEqual([SOUNDING_MODEL_SET]);
      expect(await repo.deleteSounding('QMR-1', sounding(0).epochMs)).toBe(true);
      expect(await repo.deleteSounding('QMR-1', sounding(0).epochMs)).toBe(false);
      expect(await repo.readSoundings('QMR-1', { fromMs: 0, toMs: T0 * 2 })).toHaveLength(3);
      await expect(repo.putSounding('NOPE', sounding(0), SOUNDING_MODEL_SET)).rejects.toBeInstanceOf(UnknownStationError);
      await repo.purgeStation('QMR-1');
      expect(await repo.readSoundings('QMR-1', { fromMs: 0, toMs: T0 * 2 })).toEqual([]);
      expect((await repo.readSoundings('QMR-2', { fromMs: 0, toMs: T0 * 2 }))[0]!.pwvMm).toBe(99);
    });

    if (backend.name === 'postgres') {
      it('two replicas starting at once migrate safely (advisory lock): both open, one schema version', async () => {
        const { config, cleanup } = await backend.fresh();
        cleanups.push(cleanup);
        const [a, b] = await Promise.all([createRepository(config), createRepository(config)]);
        opened.push(a, b);
        await a.putStation('QMR-1', STATION);
        expect((await b.getStation('QMR-1'))!.name).toBe(STATION.name);
        const pg = await import('pg');
        const client = new pg.default.Client({ connectionString: config.databaseUrl });
        await client.connect();
        try {
          const versions = await client.query(`SELECT version FROM "${config.pgSchema}".schema_migrations ORDER BY version`);
          expect(versions.rows.map((r) => r.version)).toEqual(MIGRATIONS.map((m) => m.version));
        } finally {
          await client.end();
        }
      });
    }
  });
}
