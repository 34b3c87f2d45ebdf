/**
 * Loads the training-step engines so they register themselves (runner/training/engine.ts).
 * The tfjs engine is registered as a lazy factory: its module (and TF.js with it, ≈ 2 s per
 * worker process) is imported only when a job actually trains on TF.js. The native engine
 * is optional (a compiled addon another part of the project builds): its module is imported
 * when present and skipped silently when it is not.
 */
import { getEngineFactory, registerEngine } from './engine.ts';

let loaded: Promise<void> | undefined;

/** Imports every engine module once; safe to call repeatedly. */
export function loadEngines(): Promise<void> {
  loaded ??= (async () => {
    // tfjs-engine.ts registers its real factory when imported; until then this stands in.
    if (getEngineFactory('tfjs') === undefined) {
      registerEngine('tfjs', async (options) =>
        (await import('./tfjs-engine.ts')).createTfjsEngine(options),
      );
    }
    // A variable specifier: the file may not exist in every checkout.
    const nativeModule = './native-engine.ts';
    try {
      await import(nativeModule);
    } catch {
      // No native engine in this checkout or it failed to load: 'auto' uses tfjs.
    }
  })();
  return loaded;
}
