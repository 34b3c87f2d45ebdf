/**
 * TF.js backend selection, once per process. Order: '@tensorflow/tfjs-node' when it is
 * installed and loads (an optional dependency, absent on most machines), else the wasm
 * backend with SIMD, else the plain JS 'cpu' backend. The choice and thread count are
 * recorded in every training result.
 *
 * Known behaviour of tfjs-backend-wasm 4.22 under Node: it runs one thread (the threaded
 * build needs SharedArrayBuffer workers that Node does not give it; forcing threads fails),
 * so parallelism comes from worker processes, not from here.
 */
import * as tf from '@tensorflow/tfjs';

export type BackendName = 'tensorflow' | 'wasm' | 'cpu';

/** The backend in use and what it runs on. */
export interface BackendInfo {
  name: BackendName;
  threads: number;
  simd: boolean;
}

let chosen: Promise<BackendInfo> | undefined;

/** Loads a module whose presence is optional; the name is a variable so bundlers and tsc leave it alone. */
async function importOptional(name: string): Promise<boolean> {
  try {
    await import(name);
    return true;
  } catch {
    return false;
  }
}

async function tryNode(): Promise<BackendInfo | undefined> {
  if (!(await importOptional('@tensorflow/tfjs-node'))) return undefined;
  if (!(await tf.setBackend('tensorflow'))) return undefined;
  return { name: 'tensorflow', threads: 0, simd: true };
}

async function tryWasm(): Promise<BackendInfo | undefined> {
  try {
    const wasm = await import('@tensorflow/tfjs-backend-wasm');
    if (!(await tf.setBackend('wasm'))) return undefined;
    await tf.ready();
    return {
      name: 'wasm',
      threads: wasm.getThreadsCount(),
      simd: tf.env().getBool('WASM_HAS_SIMD_SUPPORT'),
    };
  } catch {
    return undefined;
  }
}

/**
 * Selects the backend (first call) and returns what was chosen. `prefer` forces one backend,
 * for benchmarks and tests; it throws when that backend cannot load.
 */
export function selectBackend(prefer?: BackendName): Promise<BackendInfo> {
  // Production mode silences TF.js's console banners (e.g. the cpu backend's advert for
  // tfjs-node), which would otherwise interleave with the CLI's own output.
  tf.env().set('PROD', true);
  if (prefer !== undefined) return forceBackend(prefer);
  chosen ??= (async () => (await tryNode()) ?? (await tryWasm()) ?? (await useCpu()))();
  return chosen;
}

async function useCpu(): Promise<BackendInfo> {
  await tf.setBackend('cpu');
  await tf.ready();
  return { name: 'cpu', threads: 1, simd: false };
}

async function forceBackend(name: BackendName): Promise<BackendInfo> {
  const info =
    name === 'tensorflow' ? await tryNode() : name === 'wasm' ? await tryWasm() : await useCpu();
  if (info === undefined) throw new Error(`TF.js backend '${name}' is not available here`);
  chosen = Promise.resolve(info);
  return info;
}

/** Names of the backends that load on this machine (bench). */
export async function listBackends(): Promise<BackendName[]> {
  const names: BackendName[] = [];
  if (await importOptional('@tensorflow/tfjs-node')) names.push('tensorflow');
  if (await importOptional('@tensorflow/tfjs-backend-wasm')) names.push('wasm');
  names.push('cpu');
  return names;
}
