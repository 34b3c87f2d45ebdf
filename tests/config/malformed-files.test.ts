import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { ConfigErrorCode } from '../../runner/config/config-error.ts';
import { loadExperiment } from '../../runner/config/load-experiment.ts';
import { snapshotFiles } from './fixture-snapshot.ts';

const fixtures = resolve('tests/fixtures/config/bad');
const cwd = mkdtempSync(join(tmpdir(), 'midpath-check-'));
const watched = [fixtures, cwd, resolve('results')];
afterAll(() => rmSync(cwd, { recursive: true, force: true }));

/**
 * One malformed file per error class: [file, code, line, col, the file the error points
 * into when it is not the file itself]. Positions are 1-based and point at the offending
 * value (or key, for unknown and duplicate keys), counted by hand from the fixture.
 */
const cases: [string, ConfigErrorCode, number, number, string?][] = [
  ['yaml-unclosed-list.yaml', 'yaml-syntax', 3, 1],
  ['yaml-tab-indent.yaml', 'yaml-syntax', 3, 1],
  ['duplicate-key.yaml', 'duplicate-key', 5, 1],
  ['empty-comments-only.yaml', 'empty-file', 1, 1],
  ['empty-zero-bytes.yaml', 'empty-file', 1, 1],
  ['binary-nul.yaml', 'binary-file', 1, 1],
  ['binary-latin1.yaml', 'binary-file', 1, 1],
  ['not-a-mapping-list.yaml', 'not-a-mapping', 1, 1],
  ['not-a-mapping-scalar.yaml', 'not-a-mapping', 1, 1],
  ['extends-missing.yaml', 'extends-missing', 1, 10],
  ['extends-self.yaml', 'extends-cycle', 2, 10],
  ['extends-loop-a.yaml', 'extends-cycle', 2, 10, 'extends-loop-b.yaml'],
  ['extends-not-text.yaml', 'wrong-type', 1, 10],
  ['unknown-key-top.yaml', 'unknown-key', 2, 1],
  ['unknown-key-nested.yaml', 'unknown-key', 4, 3],
  ['wrong-type-text-for-number.yaml', 'wrong-type', 2, 6],
  ['wrong-type-fraction-for-integer.yaml', 'wrong-type', 3, 10],
  ['wrong-type-method.yaml', 'wrong-type', 4, 5],
  ['out-of-range-dim-zero.yaml', 'out-of-range', 2, 6],
  ['out-of-range-negative-steps.yaml', 'out-of-range', 4, 10],
  ['out-of-range-discount-one.yaml', 'out-of-range', 3, 13],
  ['out-of-range-discount-zero.yaml', 'out-of-range', 2, 20],
  ['out-of-range-zero-seeds.yaml', 'out-of-range', 3, 10],
  ['unknown-value-source.yaml', 'unknown-value', 3, 11],
  ['bad-format-name.yaml', 'bad-format', 1, 7],
  ['duplicate-value-seeds.yaml', 'duplicate-value', 3, 17],
  ['empty-list-methods.yaml', 'empty-list', 2, 10],
  ['bad-split.yaml', 'bad-split', 3, 3],
  ['needs-key-file-source.yaml', 'needs-key', 3, 11],
  ['missing-key-file-path.yaml', 'missing-key', 4, 3],
  ['duplicate-method.yaml', 'duplicate-method', 5, 5],
  ['unknown-axis.yaml', 'unknown-axis', 4, 5],
  ['axis-not-sweepable.yaml', 'axis-not-sweepable', 4, 5],
  ['axis-not-a-list.yaml', 'wrong-type', 4, 10],
  ['bad-axis-value-range.yaml', 'bad-axis-value', 4, 27],
  ['bad-axis-value-block.yaml', 'bad-axis-value', 6, 37],
  ['bad-axis-value-section.yaml', 'bad-axis-value', 7, 9],
  ['empty-axis.yaml', 'empty-axis', 4, 5],
  ['duplicate-axis-yaml-key.yaml', 'duplicate-axis', 5, 5],
  ['duplicate-axis-together.yaml', 'duplicate-axis', 6, 7],
  ['duplicate-axis-overlap.yaml', 'duplicate-axis', 6, 5],
  ['episodes-too-short.yaml', 'episodes-too-short', 4, 3],
  ['episodes-too-short-axis.yaml', 'episodes-too-short', 8, 22],
  ['together-length.yaml', 'together-length', 5, 7],
  ['too-many-jobs-limit.yaml', 'too-many-jobs', 4, 1],
  ['too-many-jobs-default.yaml', 'too-many-jobs', 2, 1],
];

describe('malformed experiment files', () => {
  it.each(cases)('%s → %s at %i:%i', async (name, code, line, col, pointsInto) => {
    const before = snapshotFiles(watched);
    const result = await loadExperiment(join(fixtures, name), { cwd });
    expect(snapshotFiles(watched)).toEqual(before);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors).toHaveLength(1);
    const [error] = result.errors;
    expect(error).toMatchObject({ code, line, col, file: join(fixtures, pointsInto ?? name) });
    // Our own messages read "expected …, got …"; YAML syntax messages come from the parser.
    const ownWording = !['yaml-syntax', 'duplicate-key', 'duplicate-axis', 'unknown-key'].includes(
      code,
    );
    if (ownWording)
      expect(error?.message).toMatch(/^(value \d+ of axis `[^`]+`: )?expected .+, got .+/);
  });

  it('a file that does not exist, and a folder, are coded errors, not exceptions', async () => {
    const missing = await loadExperiment('no/such/file.yaml', { cwd });
    expect(missing).toMatchObject({
      ok: false,
      errors: [{ code: 'file-not-found', line: 1, col: 1 }],
    });
    const folder = await loadExperiment(fixtures, { cwd });
    expect(folder).toMatchObject({
      ok: false,
      errors: [{ code: 'file-unreadable', line: 1, col: 1 }],
    });
  });

  it('unknown keys and enum typos carry a "did you mean" hint (Levenshtein)', async () => {
    const top = await loadExperiment(join(fixtures, 'unknown-key-top.yaml'), { cwd });
    const source = await loadExperiment(join(fixtures, 'unknown-value-source.yaml'), { cwd });
    const axis = await loadExperiment(join(fixtures, 'unknown-axis.yaml'), { cwd });
    expect(top.ok ? '' : top.errors[0]?.hint).toBe('did you mean `train`?');
    expect(source.ok ? '' : source.errors[0]?.hint).toBe('did you mean `rover-maze`?');
    expect(axis.ok ? '' : axis.errors[0]?.hint).toBe('did you mean `train.discount`?');
  });

  it('reports every error of a file, sorted by position, not only the first', async () => {
    const result = await loadExperiment(join(fixtures, '../many-errors.yaml'), { cwd });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors.map((e) => `${e.code}@${e.line}:${e.col}`)).toEqual([
      'out-of-range@2:6',
      'unknown-key@4:3',
      'unknown-value@5:11',
      'unknown-axis@9:5',
      'empty-axis@10:5',
    ]);
  });
});
