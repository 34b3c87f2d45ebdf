import { createHash } from 'node:crypto';
import type { Dataset } from '../../runner/data/episode.ts';

/** SHA-256 over the bytes of every observation and state buffer, in split order. */
export function hashDataset(ds: Dataset): string {
  const h = createHash('sha256');
  for (const ep of [...ds.train, ...ds.val, ...ds.test]) {
    h.update(new Uint8Array(ep.obs.buffer, ep.obs.byteOffset, ep.obs.byteLength));
    if (ep.state)
      h.update(new Uint8Array(ep.state.buffer, ep.state.byteOffset, ep.state.byteLength));
  }
  return h.digest('hex');
}
