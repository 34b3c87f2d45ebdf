/**
 * Plugin encoders: a user module (.js, .mjs or .ts; path relative to the experiment file,
 * `encoder.plugin`) that exports a factory
 *
 *   export function createEncoder(context: PluginContext): PluginEncoder | Promise<PluginEncoder>
 *
 * (a default export of the same function is accepted too). The factory receives Midpath's
 * own TF.js module — use it rather than importing another copy, so tensors share a backend.
 * Midpath probes `apply` once with a [2, inputDim] batch and checks the output is
 * [2, outputDim]. Errors carry the codes plugin-not-found, plugin-load-failed,
 * plugin-bad-export, plugin-factory-failed and plugin-bad-output (docs/training.md).
 */
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import * as tf from '@tensorflow/tfjs';
import { TrainingError } from '../training/training-error.ts';
import type { EncoderContext, EncoderDefinition, TfEncoder } from './encoder.ts';

/** What a plugin factory receives. */
export interface PluginContext {
  tf: typeof tf;
  inputDim: number;
  outputDim: number;
  imageShape?: [number, number];
  /** `encoder.options` from the config, passed through untouched. */
  options: Record<string, unknown>;
  /** Seed for the plugin's own initialisation (derived from the job seed). */
  seed: number;
}

/** What a plugin factory returns. */
export interface PluginEncoder {
  /** Trainable variables (created with ctx.tf.variable). */
  variables: tf.Variable[];
  /** ψ: [n, inputDim] → [n, outputDim]; called inside Midpath's tidy scopes. */
  apply(x: tf.Tensor2D): tf.Tensor2D;
  /** Optional clean-up of constants the plugin created. */
  dispose?(): void;
}

type Factory = (context: PluginContext) => PluginEncoder | Promise<PluginEncoder>;

async function importPlugin(file: string, where: string): Promise<Record<string, unknown>> {
  try {
    return (await import(pathToFileURL(file).href)) as Record<string, unknown>;
  } catch (error) {
    const e = error as NodeJS.ErrnoException & { url?: string };
    const missing =
      (e.code === 'ERR_MODULE_NOT_FOUND' || e.code === 'ENOENT') &&
      (e.url === pathToFileURL(file).href || String(e.message).includes(file));
    if (missing) {
      throw new TrainingError(
        'plugin-not-found',
        `expected a module at ${file}, got no such file; paths are relative to the experiment file`,
        where,
      );
    }
    throw new TrainingError(
      'plugin-load-failed',
      `expected the module ${file} to load, got: ${e.message}`,
      where,
    );
  }
}

function findFactory(module: Record<string, unknown>, file: string, where: string): Factory {
  const candidate = module.createEncoder ?? module.default;
  if (typeof candidate !== 'function') {
    throw new TrainingError(
      'plugin-bad-export',
      `expected ${file} to export a function createEncoder(context), got ${Object.keys(module).join(', ') || 'no exports'}`,
      where,
    );
  }
  return candidate as Factory;
}

function checkOutput(encoder: PluginEncoder, context: EncoderContext, where: string): void {
  const probe = (): string => {
    try {
      return tf.tidy(() => {
        const out = encoder.apply(tf.zeros([2, context.obsDim]));
        return out instanceof tf.Tensor ? `[${out.shape.join(', ')}]` : typeof out;
      });
    } catch (error) {
      throw new TrainingError(
        'plugin-factory-failed',
        `expected apply() to run on a [2, ${context.obsDim}] batch, it threw: ${(error as Error).message}`,
        where,
      );
    }
  };
  const got = probe();
  if (got !== `[2, ${context.dim}]`) {
    throw new TrainingError(
      'plugin-bad-output',
      `expected apply() to return a tensor of shape [2, ${context.dim}] (batch, dim), got ${got}; outputDim is the config's dim`,
      where,
    );
  }
}

async function buildPlugin(context: EncoderContext): Promise<TfEncoder> {
  const where = 'encoder.plugin';
  const relative = context.config.plugin;
  if (relative === undefined || relative === '') {
    throw new TrainingError(
      'plugin-not-found',
      "expected a module path, got none; set encoder.plugin: './my-encoder.js'",
      where,
    );
  }
  const file = path.resolve(context.baseDir ?? '.', relative);
  const factory = findFactory(await importPlugin(file, where), file, where);
  let encoder: PluginEncoder;
  try {
    encoder = await factory({
      tf,
      inputDim: context.obsDim,
      outputDim: context.dim,
      ...(context.imageShape === undefined ? {} : { imageShape: context.imageShape }),
      options: context.config.options,
      seed: context.seed,
    });
  } catch (error) {
    throw new TrainingError(
      'plugin-factory-failed',
      `expected createEncoder() to return an encoder, it threw: ${(error as Error).message}`,
      where,
    );
  }
  if (
    encoder === null ||
    typeof encoder !== 'object' ||
    typeof encoder.apply !== 'function' ||
    !Array.isArray(encoder.variables)
  ) {
    throw new TrainingError(
      'plugin-bad-output',
      'expected createEncoder() to return { variables: tf.Variable[], apply(x) }, got something else',
      where,
    );
  }
  checkOutput(encoder, context, where);
  return {
    kind: 'plugin',
    variables: encoder.variables,
    apply: (x) => encoder.apply(x),
    dispose: () => {
      encoder.dispose?.();
      encoder.variables.forEach((v) => v.dispose());
    },
  };
}

/** The 'plugin' entry of the encoder map. */
export const pluginEncoder: EncoderDefinition = { build: (context) => buildPlugin(context) };
