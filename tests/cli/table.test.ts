import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { makeFixtureRun } from '../report/fixture-run.ts';

let dir = '';
let cleanup = (): void => {};
beforeAll(() => {
  ({ dir, cleanup } = makeFixtureRun());
});
afterAll(() => cleanup());

describe('midpath table', () => {
  it('prints the tidy JSON table of a run, filtered by --metric', async () => {
    const io = bufferIo();
    expect(await main(['table', dir, '--format', 'json', '--metric', 'bridge_nmse'], io)).toBe(0);
    const table = JSON.parse(io.stdout.join('')) as { rows: { metric: string; n: number }[] };
    expect(table.rows).toHaveLength(2 * 3 * 2);
    expect(new Set(table.rows.map((r) => r.metric))).toEqual(new Set(['bridge_nmse']));
    expect(table.rows.every((r) => r.n === 3)).toBe(true);
  });

  it('resolves DIR against the working directory', async () => {
    const io = bufferIo(dir);
    expect(await main(['table', '.', '--format', 'csv', '--metric', 'coverage_50'], io)).toBe(0);
    expect(io.stdout.join('')).toContain('coverage_50');
  });

  it('rejects an unknown metric with exit 2, code unknown-metric and a suggestion', async () => {
    const io = bufferIo();
    expect(await main(['table', dir, '--format', 'csv', '--metric', 'bridge_nmes'], io)).toBe(2);
    const text = io.stderr.join('');
    expect(text).toContain('(unknown-metric)');
    expect(text).toContain('did you mean bridge_nmse');
  });

  it('rejects an unknown format with exit 2 and code unknown-format', async () => {
    const io = bufferIo();
    expect(await main(['table', dir, '--format', 'xlsx'], io)).toBe(2);
    expect(io.stderr.join('')).toContain('(unknown-format)');
  });

  it('rejects a directory without results with exit 2 and code no-results', async () => {
    const io = bufferIo();
    expect(await main(['table', `${dir}/jobs/nowhere`, '--format', 'csv'], io)).toBe(2);
    expect(io.stderr.join('')).toContain('(no-results)');
  });

  it('rejects a missing --format with a usage message', async () => {
    const io = bufferIo();
    expect(await main(['table', dir], io)).toBe(2);
    expect(io.stderr.join('')).toContain('Usage: midpath table');
  });
});
