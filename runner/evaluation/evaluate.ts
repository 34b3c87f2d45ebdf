/**
 * Evaluates one fitted representation on its dataset: every suite the job asks for, on the
 * tasks drawn from the evaluation seed (shared by every method and training seed).
 */
import type { Dataset } from '../data/episode.ts';
import type { EvalJobSpec } from '../plan/job-spec.ts';
import type { Representation } from '../training/representation.ts';
import { buildContext } from './build-context.ts';
import { EvaluationError } from './evaluation-error.ts';
import type { MetricRow } from './metric.ts';
import { suites } from './suites/index.ts';

export interface Evaluation {
  metrics: MetricRow[];
  /**
   * JSON-ready plot data and details, one entry per suite that produced any (projections,
   * per-waypoint errors, calibration histograms, per-dimension diagnostics), plus
   * `diagnostics` (transition models used, notes on skipped sources and repairs).
   */
  artifacts: Record<string, unknown>;
}

/** Runs the suites of `spec.eval` on `rep` over `dataset`'s test episodes. */
export function evaluateRepresentation(
  rep: Representation,
  dataset: Dataset,
  spec: EvalJobSpec,
): Promise<Evaluation> {
  try {
    return Promise.resolve(evaluateNow(rep, dataset, spec));
  } catch (error) {
    return Promise.reject(error instanceof Error ? error : new Error(String(error)));
  }
}

function evaluateNow(rep: Representation, dataset: Dataset, spec: EvalJobSpec): Evaluation {
  if (dataset.test.length === 0) {
    throw new EvaluationError(
      'no-test-episodes',
      `dataset ${dataset.name}: expected test episodes, got 0`,
      'raise data.split.test above 0 or add episodes',
    );
  }
  const context = buildContext(rep, dataset, {
    config: spec.eval,
    discount: spec.train.train.discount,
    scale: spec.train.train.scale,
  });
  const metrics: MetricRow[] = [];
  const artifacts: Record<string, unknown> = {};
  for (const name of spec.eval.suites) {
    const out = suites[name](context);
    metrics.push(...out.metrics);
    if (out.artifacts !== undefined) artifacts[name] = toJsonReady(out.artifacts);
  }
  artifacts.diagnostics = {
    method: rep.method,
    dim: rep.dim,
    spread: context.spread,
    models: context.models.map((m) => ({
      source: m.source,
      unit: m.unit,
      F: Array.from(m.model.F.data),
      Q: Array.from(m.model.Q.data),
      notes: m.model.notes,
    })),
    notes: context.notes,
  };
  return { metrics, artifacts };
}

/** Typed arrays become plain arrays so JSON.stringify writes them as lists. */
export function toJsonReady(value: unknown): unknown {
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    return Array.from(value as unknown as ArrayLike<number>);
  }
  if (Array.isArray(value)) return value.map(toJsonReady);
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, toJsonReady(v)]));
  }
  return value;
}
