/**
 * Reads the plot inputs that jobs leave as artifacts, defensively: a file that is missing,
 * unreadable or shaped differently is skipped (and counted), never fatal — the report then
 * omits that plot with a note. Formats accepted (docs/report.md):
 *   train    curves.json       CurvePoint[] (runner/training/representation.ts)
 *   evaluate projections.json { projection: { points: [x, y][], step?: number[], state?: number[][] } }
 *   evaluate bridge.json      { profiles: { source, unit, T, nmse: number[T] }[] }  (error per waypoint)
 */
import { existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { basename, join, sep } from 'node:path';
import { artifactsDirOf, jobDirOf } from '../store/job-paths.ts';
import type { JobResult } from '../store/result.ts';

export interface CurveRow {
  step: number;
  /** Named series → value at this step (trainLoss, valLoss, trainAccuracy, valAccuracy, …). */
  values: Record<string, number>;
}

export interface Projection {
  /** [count][2] */
  points: [number, number][];
  colour?: number[];
  /** What the colour shows, for the caption. */
  colourBy: string;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function finiteNumbers(v: unknown): v is number[] {
  return Array.isArray(v) && v.every((x) => typeof x === 'number');
}

/** The path of the first artifact of `result` named one of `names`, or null. */
export function findArtifact(
  dir: string,
  result: JobResult,
  names: readonly string[],
): string | null {
  let jobDir: string;
  let artifactsDir: string;
  try {
    jobDir = jobDirOf(dir, result.id);
    artifactsDir = artifactsDirOf(dir, result.id);
  } catch {
    return null; // an id that is not a safe file name: nothing to read
  }
  const listed = Array.isArray(result.artifacts)
    ? result.artifacts.filter((a) => typeof a === 'string')
    : [];
  for (const name of names) {
    // Contract: paths relative to the job directory; older writers listed bare file names.
    const entries = listed.filter((a) => basename(a) === name);
    const candidates = [
      ...entries.map((a) => join(jobDir, a)),
      ...entries.map((a) => join(artifactsDir, a)),
      join(artifactsDir, name),
    ];
    for (const path of candidates) {
      if (!path.startsWith(jobDir + sep)) continue; // never read outside the job's directory
      if (existsSync(path)) return path;
    }
  }
  return null;
}

async function readJsonArtifact(path: string | null): Promise<unknown> {
  if (path === null) return undefined;
  try {
    return JSON.parse(await readFile(path, 'utf8')) as unknown;
  } catch {
    return undefined;
  }
}

/** Training curve rows, or null when absent or malformed. */
export async function readCurves(dir: string, result: JobResult): Promise<CurveRow[] | null> {
  const raw = await readJsonArtifact(findArtifact(dir, result, ['curves.json']));
  const list = Array.isArray(raw) ? raw : isRecord(raw) ? (raw.points ?? raw.curve) : undefined;
  if (!Array.isArray(list) || list.length === 0) return null;
  const rows: CurveRow[] = [];
  for (const item of list) {
    if (!isRecord(item) || typeof item.step !== 'number') return null;
    const values: Record<string, number> = {};
    for (const [key, value] of Object.entries(item)) {
      if (key !== 'step' && typeof value === 'number' && Number.isFinite(value))
        values[key] = value;
    }
    rows.push({ step: item.step, values });
  }
  return rows;
}

/** The 2-D projection of an evaluate job (projections.json, `{ projection: {...} }`), or null. */
export async function readProjection(dir: string, result: JobResult): Promise<Projection | null> {
  const raw = await readJsonArtifact(
    findArtifact(dir, result, ['projections.json', 'projection.json']),
  );
  const body = isRecord(raw) && isRecord(raw.projection) ? raw.projection : raw;
  if (!isRecord(body) || !Array.isArray(body.points) || body.points.length === 0) return null;
  const points = body.points as unknown[];
  if (!points.every((p) => finiteNumbers(p) && p.length >= 2)) return null;
  const pairs = (points as number[][]).map(
    (p) => [p[0] ?? Number.NaN, p[1] ?? Number.NaN] as [number, number],
  );
  // Colour by the first true-state coordinate when known, else by the time step.
  const state = Array.isArray(body.state)
    ? body.state.map((s) => (finiteNumbers(s) ? s[0] : undefined))
    : [];
  if (state.length === pairs.length && state.every((v) => typeof v === 'number')) {
    return { points: pairs, colour: state, colourBy: 'true state, first coordinate' };
  }
  const step = body.step;
  if (finiteNumbers(step) && step.length === pairs.length)
    return { points: pairs, colour: step, colourBy: 'time step' };
  return { points: pairs, colourBy: 'point order' };
}

/** One bridge profile: error at each waypoint index of T waypoints (bridge.json `profiles`). */
export interface BridgeProfile {
  source: string;
  unit: string;
  T: number;
  /** [T] */
  nmse: number[];
}

/** Bridge profiles of an evaluate job (bridge.json), or null. */
export async function readBridgeProfiles(
  dir: string,
  result: JobResult,
): Promise<BridgeProfile[] | null> {
  const raw = await readJsonArtifact(findArtifact(dir, result, ['bridge.json']));
  if (!isRecord(raw) || !Array.isArray(raw.profiles)) return null;
  const profiles: BridgeProfile[] = [];
  for (const p of raw.profiles) {
    if (!isRecord(p) || typeof p.T !== 'number' || !finiteNumbers(p.nmse) || p.nmse.length !== p.T)
      continue;
    profiles.push({
      source: typeof p.source === 'string' ? p.source : '',
      unit: typeof p.unit === 'string' ? p.unit : '',
      T: p.T,
      nmse: p.nmse,
    });
  }
  return profiles.length > 0 ? profiles : null;
}
