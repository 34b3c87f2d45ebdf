/**
 * Loads the training-step engines so they register themselves (runner/training/engine.ts).
 * The native engine is optional (a compiled addon another part of the project builds):
 * its module is imported when present and skipped silently when it is not.
 */
import './tfjs-engine.ts';

let loaded: Promise<void> | undefined;

/** Imports every engine module once; safe to call repeatedly. */
export function loadEngines(): Promise<void> {
  loaded ??= (async () => {
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
