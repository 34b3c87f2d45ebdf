import { loadExperiment } from '../runner/config/load-experiment.ts';
import { expandPlan } from '../runner/plan/expand-plan.ts';
const r = await loadExperiment(process.argv[2]!);
if (!r.ok) throw new Error('bad');
const jobs = expandPlan(r.config, r.baseDir);
for (const j of jobs) console.log(j.kind, j.id, j.method.label, j.seed, JSON.stringify(j.setting), j.kind === 'evaluate' ? j.trainId : '');
