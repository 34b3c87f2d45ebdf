import type { ResolvedExperiment } from '../../runner/config/schema-types.generated.ts';
import type { ExperimentConfig, DataConfig } from '../../runner/config/types.ts';
type Equals<A, B> = (<T>() => T extends A ? 1 : 2) extends <T>() => T extends B ? 1 : 2 ? true : false;
type Drifted = Omit<ExperimentConfig, 'data'> & { data: DataConfig & { extra?: number } };
export const probe: Equals<ResolvedExperiment, Drifted> = true;
