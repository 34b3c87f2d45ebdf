import { describe, expect, it } from 'vitest';
import {
  chunkJobs,
  formatSlurmTime,
  quoteShell,
  renderBatchScript,
} from '../../runner/execute/slurm/batch-script.ts';
import type { TaskStates } from '../../runner/execute/slurm/scheduler-states.ts';
import {
  parseKeyValueStates,
  parseSqueue,
  phaseOf,
} from '../../runner/execute/slurm/scheduler-states.ts';

describe('SLURM batch scripts', () => {
  it('renders an array script with the options as #SBATCH lines and a quoted task command', () => {
    const text = renderBatchScript({
      experiment: 'greenhouse',
      kind: 'train',
      tasks: 4,
      maxParallel: 2,
      dir: '/shared/results/greenhouse',
      manifest: '/shared/results/greenhouse/slurm/submission-1.json',
      arrayIndex: 0,
      partition: 'cpu',
      time: '01:05:00',
      cpusPerTask: 4,
      extra: ['--mem=8G'],
      midpath: 'node /opt/midpath/bin/midpath.mjs',
    });
    expect(text.split('\n').filter((l) => l.startsWith('#SBATCH'))).toEqual([
      '#SBATCH --job-name=midpath-greenhouse-train',
      '#SBATCH --array=0-3%2',
      '#SBATCH --cpus-per-task=4',
      '#SBATCH --time=01:05:00',
      '#SBATCH --output=/shared/results/greenhouse/slurm/logs/%A_%a.out',
      '#SBATCH --partition=cpu',
      '#SBATCH --mem=8G',
    ]);
    expect(text).toContain(
      "run --slurm-task '/shared/results/greenhouse/slurm/submission-1.json#0'",
    );
  });

  it('chunks large sweeps under the array limit, keeping order', () => {
    const ids = Array.from({ length: 2501 }, (_, i) => `j${i}`);
    const chunks = chunkJobs(ids, 1000);
    expect(chunks.length).toBeLessThanOrEqual(1000);
    expect(chunks.flat()).toEqual(ids);
    expect(chunkJobs(['a', 'b'], 1000)).toEqual([['a'], ['b']]);
  });

  it('formats time limits and quotes shell words', () => {
    expect([formatSlurmTime(65), formatSlurmTime(0.2), formatSlurmTime(1500)]).toEqual([
      '01:05:00',
      '00:01:00',
      '25:00:00',
    ]);
    expect(quoteShell("it's here")).toBe("'it'\\''s here'");
  });
});

describe('SLURM task states', () => {
  it('reads squeue ranges, scontrol and job-completion lines', () => {
    const states: TaskStates = new Map();
    // Formats as printed by SLURM 22.05 (scontrol show job -o; jobcomp/filetxt), trimmed.
    parseKeyValueStates(
      'JobId=3 ArrayJobId=12 ArrayTaskId=1 JobState=TIMEOUT Reason=TimeLimit',
      new Set(['12']),
      states,
    );
    parseKeyValueStates(
      'JobId=9 UserId=root(0) JobState=FAILED ArrayJobId=99 ArrayTaskId=0',
      new Set(['12']),
      states,
    );
    parseSqueue('12_0|RUNNING\n12_[2-4,7%2]|PENDING\n', states);
    expect(Object.fromEntries(states)).toEqual({
      '12_0': 'RUNNING',
      '12_1': 'TIMEOUT',
      '12_2': 'PENDING',
      '12_3': 'PENDING',
      '12_4': 'PENDING',
      '12_7': 'PENDING',
    });
    expect(['PENDING', 'RUNNING', 'TIMEOUT', 'CANCELLED by 0', 'COMPLETED'].map(phaseOf)).toEqual([
      'queued',
      'running',
      'ended',
      'ended',
      'ended',
    ]);
  });
});
