import { createHash } from 'node:crypto';
import { canonicalJson } from '../config/canonical-json.ts';

/** Bumped when the meaning of a job's inputs changes, so old results are not reused wrongly. */
export const JOB_FORMAT = 'midpath-job/1';

/** Hex characters kept of the SHA-256 digest: 64 bits, ample for any one results store. */
export const ID_LENGTH = 16;

/**
 * A job id: the SHA-256 of the canonical JSON (keys sorted at every depth) of exactly the
 * inputs that determine the job's output, so YAML key order, comments and layout never
 * change it, and any change of a value that matters does.
 */
export function hashJob(inputs: Record<string, unknown>): string {
  const text = canonicalJson({ format: JOB_FORMAT, ...inputs });
  return createHash('sha256').update(text).digest('hex').slice(0, ID_LENGTH);
}
