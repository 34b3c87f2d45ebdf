/** Picks the TF.js backend once per test file (the same selection the runner makes). */
import { selectBackend, type BackendInfo } from '../../runner/encoders/backend.ts';

/** The backend the tests run on. */
export function setupBackend(): Promise<BackendInfo> {
  return selectBackend();
}
