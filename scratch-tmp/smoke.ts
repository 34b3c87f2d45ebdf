import { loadExperiment } from '../runner/config/load-experiment.ts';
import { formatConfigErrors } from '../runner/config/config-error.ts';
const r = await loadExperiment(process.argv[2]!, { overrides: process.argv.slice(3) });
if (r.ok) console.log(JSON.stringify(r.config, null, 1).slice(0, 3000)); else console.log(formatConfigErrors(r.errors));
