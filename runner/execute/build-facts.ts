/**
 * Facts about this Midpath and this machine that go into every job's provenance, gathered
 * once per run by the runner process (workers do not need git).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { fileURLToPath } from 'node:url';

export interface BuildFacts {
  midpathVersion: string;
  /** HEAD of the checkout Midpath runs from, or null outside a git checkout / without git. */
  gitCommit: string | null;
  nodeVersion: string;
  hostname: string;
}

const packageRoot = fileURLToPath(new URL('../../', import.meta.url));

function readGitCommit(): string | null {
  try {
    const out = execFileSync('git', ['rev-parse', 'HEAD'], {
      cwd: packageRoot,
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'ignore'],
      timeout: 5000,
    }).trim();
    return /^[0-9a-f]{40}$/.test(out) ? out : null;
  } catch {
    return null; // no git, or not a checkout (an installed package): provenance says so
  }
}

let cached: BuildFacts | undefined;

/** Reads the version from package.json and the git commit (once per process). */
export function readBuildFacts(): BuildFacts {
  if (cached) return cached;
  const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as {
    version: string;
  };
  cached = {
    midpathVersion: pkg.version,
    gitCommit: readGitCommit(),
    nodeVersion: process.version,
    hostname: hostname(),
  };
  return cached;
}
