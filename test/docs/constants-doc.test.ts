import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { BEVIS_1994 } from '../../src/domain/constants.js';
import {
  NIELL_HEIGHT_CORRECTION,
  NIELL_HYDROSTATIC_AMPLITUDE,
  NIELL_HYDROSTATIC_AVERAGE,
  NIELL_WET,
} from '../../src/domain/mapping/niell.js';
import { REFRACTIVITY_CONSTANT_SETS } from '../../src/domain/profile/refractivity.js';

// docs/constants.md is the in-repository record of which constants are confirmed and which are from
// memory (transcribed from the project's reference notes). These tests keep the record and the code
// saying the same numbers: a digit changed on either side fails here.
const DOC = readFileSync(new URL('../../docs/constants.md', import.meta.url), 'utf8');

/** The cells of the markdown table row whose first cell is `label`, as numbers. */
function rowNumbers(label: string): number[] {
  const line = DOC.split('\n').find((l) => l.startsWith(`| ${label} |`));
  if (!line) throw new Error(`docs/constants.md has no table row "${label}"`);
  return line
    .split('|')
    .slice(2, -1)
    .map((cell) => Number(cell.trim()));
}

describe('docs/constants.md against the code', () => {
  it('the Niell (1996) coefficient table is the one in src/domain/mapping/niell.ts, cell by cell', () => {
    const tables = { hyd_average: NIELL_HYDROSTATIC_AVERAGE, hyd_amplitude: NIELL_HYDROSTATIC_AMPLITUDE } as const;
    for (const coefficient of ['a', 'b', 'c'] as const) {
      expect(rowNumbers(`${coefficient}_hyd average`)).toEqual([...tables.hyd_average[coefficient]]);
      expect(rowNumbers(`${coefficient}_hyd amplitude`)).toEqual([...tables.hyd_amplitude[coefficient]]);
      expect(rowNumbers(`${coefficient}_wet`)).toEqual([...NIELL_WET[coefficient]]);
    }
    const { a, b, c } = NIELL_HEIGHT_CORRECTION;
    expect(DOC).toContain(`a_ht = ${a.toExponential()}, b_ht = ${b.toExponential()}, c_ht = ${c.toExponential()}`);
  });

  it('every refractivity constant set of the code is listed with its k1, k2, k3', () => {
    for (const set of Object.values(REFRACTIVITY_CONSTANT_SETS)) {
      const line = DOC.split('\n').find((l) => l.startsWith(`| \`${set.key}\``));
      expect(line, set.key).toBeDefined();
      const [k1, k2, k3] = line!
        .split('|')
        .slice(2, 5)
        .map((cell) => Number(cell.trim()));
      expect([k1, k2, k3], set.key).toEqual([set.k1KPerHpa, set.k2KPerHpa, set.k3K2PerHpa]);
    }
    expect(DOC).toContain(`k1 = ${BEVIS_1994.k1_K_per_hPa.toFixed(2)} K/hPa, k2 = ${BEVIS_1994.k2_K_per_hPa} K/hPa`);
  });

  it('no source, test, script or doc points at a notes file outside the repository', () => {
    // git grep over the tracked tree (status 1: no match). The old pointer named a file beside the checkout.
    const outside = ['published', 'constants'].join('-');
    const result = spawnSync(
      'git',
      ['grep', '-l', '-e', outside, '-e', '\\.\\./shared/', '--', 'src', 'test', 'scripts', 'bench', 'docs', 'README.md', 'DEVELOPERS.md'],
      {
        cwd: fileURLToPath(new URL('../..', import.meta.url)),
        encoding: 'utf8',
      },
    );
    expect(result.stdout).toBe('');
    expect(result.status).toBe(1);
  });
});
