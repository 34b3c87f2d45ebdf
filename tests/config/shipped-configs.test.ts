import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadExperiment } from '../../runner/config/load-experiment.ts';

/** Every YAML file under configs/, recursively. */
function listYaml(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return listYaml(path);
    return /\.ya?ml$/.test(entry.name) ? [path] : [];
  });
}

const files = listYaml('configs');

describe('shipped experiment files', () => {
  it('include the demo and the research configs', () => {
    for (const name of ['demo', 'overnight-sweep', 'planning-study', 'encoder-benchmark']) {
      expect(files).toContain(join('configs', `${name}.yaml`));
    }
  });

  it.each(files)('%s starts with the editor schema hint and is valid', async (file) => {
    const schemaPath = relative(dirname(file), 'configs/schema.json');
    const expected = `# yaml-language-server: $schema=${schemaPath.startsWith('.') ? schemaPath : `./${schemaPath}`}`;
    expect(readFileSync(file, 'utf8').split('\n')[0]).toBe(expected);
    const result = await loadExperiment(file);
    expect(result.ok ? [] : result.errors).toEqual([]);
  });
});
