/**
 * The report's figures, drawn at report time by our own SVG code: error against
 * representation dimension, against horizon, against waypoint index; training curves; 2-D
 * projections. Points and intervals of the first two come straight from the shared
 * aggregation (the tables' numbers); the others summarise artifacts over seeds with the same
 * t-interval. A figure whose inputs are missing is left out with a note saying why.
 */
import type { LoadedRun } from '../load-run.ts';
import { figureByWaypoint, figureProjections, figureTrainingCurves } from './artifact-figures.ts';
import type { FigureGroup } from './figure-helpers.ts';
import { figureByDimension, figureByHorizon } from './summary-figures.ts';

export type { FigureGroup } from './figure-helpers.ts';

/** Every figure group, in page order. */
export async function buildFigures(run: LoadedRun): Promise<FigureGroup[]> {
  return [
    figureByDimension(run),
    figureByHorizon(run),
    await figureByWaypoint(run),
    await figureTrainingCurves(run),
    await figureProjections(run),
  ];
}
