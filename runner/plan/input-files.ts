/**
 * The files a train job reads (a data file, an encoder plugin module, precomputed
 * embeddings) and the SHA-256 of their contents. The digests enter the job's id, so editing
 * a file reruns the jobs that read it on the next `run`, while moving the experiment
 * directory or touching a file without changing it keeps every kept result.
 * A plugin is digested by its entry module only; modules it imports are not followed.
 */
import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import { isAbsolute, resolve } from 'node:path';
import type { ExperimentConfig, MethodConfig } from '../config/types.ts';
import { METHOD_INPUTS } from '../config/method-inputs.ts';

/** Content digest of a file by its path as written, or 'unreadable' when it cannot be read. */
export type DigestOf = (path: string) => string;

/** Digests files under `baseDir` from disk (hex SHA-256), each file read once per plan. */
export function fileDigester(baseDir: string): DigestOf {
  const memo = new Map<string, string>();
  return (path) => {
    const full = isAbsolute(path) ? path : resolve(baseDir, path);
    let digest = memo.get(full);
    if (digest === undefined) {
      try {
        digest = createHash('sha256').update(readFileSync(full)).digest('hex');
      } catch {
        // The job itself reports the missing or unreadable file when it runs.
        digest = 'unreadable';
      }
      memo.set(full, digest);
    }
    return digest;
  };
}

/** The paths (as written) of the files `method`'s train job reads under `cfg`. */
export function filesReadBy(method: MethodConfig, cfg: ExperimentConfig): string[] {
  const uses = METHOD_INPUTS[method.name];
  const files: string[] = [];
  if (cfg.data.source === 'file' && cfg.data.file) files.push(cfg.data.file.path);
  if (uses.trains && cfg.encoder.kind === 'plugin' && cfg.encoder.plugin) {
    files.push(cfg.encoder.plugin);
  }
  if (uses.path && method.path !== undefined) files.push(method.path);
  return files;
}

/**
 * Digests a worker has already computed, by full path, with the file's size and modification
 * time then: a reused worker hashes a large data file once, not once per job, and hashes it
 * again as soon as either changes.
 */
const seen = new Map<string, { size: number; mtimeMs: number; digest: string }>();

function currentDigest(baseDir: string, path: string): string {
  const full = isAbsolute(path) ? path : resolve(baseDir, path);
  let stat;
  try {
    stat = statSync(full);
  } catch {
    return 'unreadable';
  }
  const known = seen.get(full);
  if (known && known.size === stat.size && known.mtimeMs === stat.mtimeMs) return known.digest;
  const digest = fileDigester(baseDir)(path);
  seen.set(full, { size: stat.size, mtimeMs: stat.mtimeMs, digest });
  return digest;
}

/**
 * Throws when a file the job reads no longer has the contents its id was planned with, so
 * a result is never kept under an id that names other data. The message says how to fix it.
 */
export function assertInputFilesUnchanged(
  inputFiles: Record<string, string> | undefined,
  baseDir: string,
): void {
  if (inputFiles === undefined) return;
  for (const [path, planned] of Object.entries(inputFiles)) {
    const digest = currentDigest(baseDir, path);
    if (digest === planned) continue;
    throw new Error(
      `${path} changed after the plan was made (sha256 ${planned.slice(0, 12)}… then, ${digest.slice(0, 12)}… now); run again so the jobs that read it are planned with its new contents`,
    );
  }
}
