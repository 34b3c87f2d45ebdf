/**
 * Whether the native tests may skip: only when the addon is not built and the run does not
 * require it. CI (CI=true) and MIDPATH_REQUIRE_NATIVE=1 require it, so a broken build fails
 * there instead of silently skipping every native test.
 */
import { loadNativeAddon, type NativeAddon } from '../../runner/training/native-loader.ts';

/** The addon, or undefined when the tests should skip (throws when it is required). */
export function nativeAddonForTests(): NativeAddon | undefined {
  const status = loadNativeAddon();
  if (status.ok) return status.addon;
  if (process.env.CI === 'true' || process.env.MIDPATH_REQUIRE_NATIVE === '1') {
    throw new Error(`the native addon is required here but unavailable: ${status.why}`);
  }
  return undefined;
}
