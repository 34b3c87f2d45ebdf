#!/usr/bin/env node
// Builds the optional native training engine (native/, see docs/native.md) from source with
// node-gyp. Run by the package's `install` script, so `npm ci` builds it; never fails the
// install: when the toolchain or the build is missing it prints one line saying that native
// training is unavailable and why, and training falls back to TF.js.
//
// Environment:
//   MIDPATH_SKIP_NATIVE=1    do not build (prints the one line and exits 0)
//   MIDPATH_NATIVE_DIR=path  build the sources in another directory (tests build a copy)
import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const nativeDir = resolve(process.env.MIDPATH_NATIVE_DIR ?? join(root, 'native'));
const logFile = join(nativeDir, 'build.log');

/** The single line the install prints when the engine is not built. */
function unavailable(why) {
  console.log(
    `midpath: native training engine unavailable (${why}); training will use TF.js. See docs/native.md.`,
  );
  process.exit(0);
}

/** node-gyp's entry script: npm's own copy (npm passes its path), else next to node. */
function findNodeGyp() {
  const candidates = [
    process.env.npm_config_node_gyp,
    join(
      dirname(process.execPath),
      '..',
      'lib',
      'node_modules',
      'npm',
      'node_modules',
      'node-gyp',
      'bin',
      'node-gyp.js',
    ),
  ];
  try {
    candidates.push(createRequire(join(root, 'package.json')).resolve('node-gyp/bin/node-gyp.js'));
  } catch {
    // not installed as a package; the bundled copies above may still exist
  }
  return candidates.find((c) => c !== undefined && c !== '' && existsSync(c));
}

/** Node's headers next to the running binary (distribution packages ship them), for offline builds. */
function findNodeDir() {
  if (process.env.npm_config_nodedir) return process.env.npm_config_nodedir;
  const prefix = resolve(dirname(process.execPath), '..');
  return existsSync(join(prefix, 'include', 'node', 'node_api.h')) ? prefix : undefined;
}

/** The most telling line of a failed build's output. */
function summarise(output) {
  const lines = output.split('\n').map((l) => l.trim());
  const patterns = [
    /not found|No such file or directory.*(g\+\+|c\+\+|make|cc)\b/i,
    /Could not find any Python/i,
    /error:/i,
    /gyp ERR! stack Error: (.*)/,
  ];
  for (const pattern of patterns) {
    const hit = lines.find((l) => pattern.test(l));
    if (hit !== undefined) return hit.replace(/^gyp ERR! (stack )?/, '').slice(0, 160);
  }
  return 'node-gyp failed';
}

function main() {
  if (process.env.MIDPATH_SKIP_NATIVE === '1') unavailable('MIDPATH_SKIP_NATIVE=1 is set');
  if (!existsSync(join(nativeDir, 'binding.gyp'))) unavailable(`no binding.gyp in ${nativeDir}`);
  const nodeGyp = findNodeGyp();
  if (nodeGyp === undefined) unavailable('node-gyp was not found next to npm');
  const nodeDir = findNodeDir();
  const args = [nodeGyp, 'rebuild', '--jobs=max', ...(nodeDir ? [`--nodedir=${nodeDir}`] : [])];
  const run = spawnSync(process.execPath, args, {
    cwd: nativeDir,
    encoding: 'utf8',
    timeout: 15 * 60 * 1000,
    maxBuffer: 64 * 1024 * 1024,
  });
  const output = `${run.stdout ?? ''}\n${run.stderr ?? ''}`;
  writeFileSync(logFile, output);
  if (run.error !== undefined) unavailable(`node-gyp could not run: ${run.error.message}`);
  if (run.status !== 0) unavailable(`build failed: ${summarise(output)}; log in ${logFile}`);
  const addonPath = join(nativeDir, 'build', 'Release', 'midpath_native.node');
  try {
    const addon = createRequire(import.meta.url)(addonPath);
    const { supported } = addon.kernels();
    console.log(`midpath: native training engine built (sgemm kernels: ${supported.join(', ')})`);
  } catch (error) {
    unavailable(`the built addon does not load: ${error.message}`);
  }
}

main();
