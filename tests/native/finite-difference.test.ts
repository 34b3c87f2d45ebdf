/**
 * The native step's analytic gradient against central finite differences in a
 * double-precision build of the same C++ template (native/test/fd-check.cc), for all 243
 * encoder × critic × loss × regulariser combinations: linear and MLP encoders (every
 * activation, with and without layer norm), distance / distance-identity / inner critics,
 * forward / backward / symmetric InfoNCE, none / penalty / KL regulariser.
 *
 * Central differences with h = 1e-5 have truncation error O(h²) ≈ 1e-10·|f'''| and rounding
 * error ≈ 1e-16·|f|/h ≈ 1e-11 (Nocedal & Wright, 2006, §8.1), so a correct gradient agrees
 * to about 1e-7 (observed ≤ 9e-8); a wrong term shows up at 1e-2 or more. Tolerance:
 * 1e-6 · max(1, largest gradient).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';

interface Row {
  encoder: string;
  activation: string;
  layerNorm: boolean;
  critic: string;
  loss: string;
  regulariser: string;
  value: number;
  maxAbsError: number;
  maxGradient: number;
}

const nativeDir = fileURLToPath(new URL('../../native/', import.meta.url));
const haveCompiler = spawnSync('g++', ['--version']).status === 0;
const required = process.env.CI === 'true' || process.env.MIDPATH_REQUIRE_NATIVE === '1';

describe.skipIf(!haveCompiler && !required)(
  'native step gradient vs finite differences (double build)',
  () => {
    const dir = mkdtempSync(join(tmpdir(), 'midpath-fd-'));
    afterAll(() => rmSync(dir, { recursive: true, force: true }));

    it('matches for every supported combination', () => {
      const exe = join(dir, 'fd-check');
      const build = spawnSync(
        'g++',
        [
          '-O1',
          '-std=c++17',
          `-I${join(nativeDir, 'src')}`,
          join(nativeDir, 'test', 'fd-check.cc'),
          '-o',
          exe,
        ],
        { encoding: 'utf8' },
      );
      expect(build.stderr).toBe('');
      expect(build.status).toBe(0);
      const run = spawnSync(exe, [], { encoding: 'utf8' });
      expect(run.status).toBe(0);
      const rows = run.stdout
        .trim()
        .split('\n')
        .map((l) => JSON.parse(l) as Row);
      expect(rows).toHaveLength(9 * 3 * 3 * 3);
      const bad = rows.filter(
        (r) => !Number.isFinite(r.value) || !(r.maxAbsError <= 1e-6 * Math.max(1, r.maxGradient)),
      );
      expect(bad).toEqual([]);
      // Non-trivial gradients everywhere: a zero gradient would pass the comparison vacuously.
      expect(Math.min(...rows.map((r) => r.maxGradient))).toBeGreaterThan(1e-2);
    }, 120_000);
  },
);
