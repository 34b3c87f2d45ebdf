/**
 * Linear and log₂ scales with "nice" tick values (Heckbert, "Nice numbers for graph labels",
 * Graphics Gems, 1990): ticks at 1, 2 or 5 × 10^k.
 */

export interface Scale {
  /** Data value → pixel. */
  map(value: number): number;
  ticks: number[];
}

function niceNumber(x: number, round: boolean): number {
  const exponent = Math.floor(Math.log10(x));
  const fraction = x / 10 ** exponent;
  let nice: number;
  if (round) nice = fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10;
  else nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  return nice * 10 ** exponent;
}

/** Nice tick values covering [lo, hi] (about `count` of them), Heckbert's loose labelling. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    return niceTicks(lo - pad, hi + pad, count);
  }
  const step = niceNumber(niceNumber(hi - lo, false) / Math.max(1, count - 1), true);
  const first = Math.floor(lo / step) * step;
  const last = Math.ceil(hi / step) * step;
  const ticks: number[] = [];
  // Round each tick to the step's decimals so 0.1 + 0.2 prints as 0.3.
  const decimals = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  for (let v = first; v <= last + step / 2; v += step) ticks.push(Number(v.toFixed(decimals)));
  return ticks;
}

/** A linear scale over nice ticks that cover [lo, hi], onto pixels [p0, p1]. */
export function linearScale(lo: number, hi: number, p0: number, p1: number): Scale {
  const ticks = niceTicks(lo, hi);
  const d0 = ticks[0] ?? lo;
  const d1 = ticks[ticks.length - 1] ?? hi;
  const span = d1 - d0 || 1;
  return { ticks, map: (v) => p0 + ((v - d0) / span) * (p1 - p0) };
}

/**
 * A log₂ scale for positive values such as representation dimensions (4, 8, 16, …), with a
 * tick at every data value; a little padding keeps end points off the axes.
 */
export function log2Scale(values: readonly number[], p0: number, p1: number): Scale {
  const ticks = [...new Set(values)].sort((a, b) => a - b);
  const lo = Math.log2(ticks[0] ?? 1) - 0.25;
  const hi = Math.log2(ticks[ticks.length - 1] ?? 2) + 0.25;
  return { ticks, map: (v) => p0 + ((Math.log2(v) - lo) / (hi - lo)) * (p1 - p0) };
}

/** A scale with a tick at every data value, evenly padded (horizons, waypoint indices). */
export function pointScale(values: readonly number[], p0: number, p1: number): Scale {
  const ticks = [...new Set(values)].sort((a, b) => a - b);
  const lo = ticks[0] ?? 0;
  const hi = ticks[ticks.length - 1] ?? 1;
  const pad = hi > lo ? (hi - lo) * 0.06 : 1;
  return { ticks, map: (v) => p0 + ((v - (lo - pad)) / (hi - lo + 2 * pad)) * (p1 - p0) };
}
