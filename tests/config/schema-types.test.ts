import { describe, expect, it } from 'vitest';
import type {
  ExperimentFile,
  ResolvedExperiment,
} from '../../runner/config/schema-types.generated.ts';
import type { ExperimentConfig } from '../../runner/config/types.ts';
import { GENERATED, readGenerated, renderAll } from '../../scripts/generate.ts';

/**
 * Type identity (not mere assignability: an extra optional key on either side fails too).
 * The trick compares two generic signatures, which TypeScript only unifies for identical types.
 */
type Equals<A, B> =
  (<T>() => T extends A ? 1 : 2) extends <T>() => T extends B ? 1 : 2 ? true : false;

// Checked by `tsc` in `npm test`: a drift between configs/schema.json (through the generated
// ResolvedExperiment) and the hand-written contract in types.ts is a compile error here.
const resolvedMatchesContract: Equals<ResolvedExperiment, ExperimentConfig> = true;
const sectionsMatch: [
  Equals<ResolvedExperiment['data'], ExperimentConfig['data']>,
  Equals<ResolvedExperiment['train'], ExperimentConfig['train']>,
  Equals<ResolvedExperiment['methods'], ExperimentConfig['methods']>,
  Equals<ResolvedExperiment['sweep'], ExperimentConfig['sweep']>,
] = [true, true, true, true];
// A resolved config is also a valid YAML file (defaults written out change nothing).
const resolvedIsAFile: [ExperimentConfig] extends [ExperimentFile] ? true : false = true;

describe('schema, types and docs agree', () => {
  it('the type-level checks above are compiled (tsc runs them; this keeps them referenced)', () => {
    expect([resolvedMatchesContract, ...sectionsMatch]).toEqual([true, true, true, true, true]);
    expect(resolvedIsAFile).toBe(true);
  });

  it('every generated file equals a fresh rendering (run `npm run generate` when this fails)', async () => {
    const fresh = await renderAll();
    for (const path of Object.values(GENERATED)) {
      expect(readGenerated(path), `${path} is stale`).toBe(fresh[path]);
    }
  });
});
