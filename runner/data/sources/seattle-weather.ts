/**
 * Real data: daily weather at Seattle, 2012-01-01 … 2015-12-31 (1461 days), as shipped in
 * the vega-datasets npm package (data/seattle-weather.csv; source NOAA National Climatic
 * Data Center, licence "U.S. Government Dataset", per the package's datapackage.json).
 * Features: precipitation (mm), temp_max and temp_min (°C), wind (the package documents
 * km/h). Episodes: consecutive non-overlapping windows of data.steps days from the first
 * day, at most data.episodes of them; the incomplete tail is dropped. No true state.
 */
import type { DataConfig } from '../../config/types.ts';
import { DataError } from '../data-error.ts';
import type { Episode } from '../episode.ts';
import { parseNumericCsv } from '../formats/csv.ts';
import type { DataIo, DataSourceImpl, SourceData } from '../source.ts';

/** The numeric columns used, in this order. */
export const WEATHER_FEATURES = ['precipitation', 'temp_max', 'temp_min', 'wind'];

/** Provenance lines shown in reports and docs. */
export const WEATHER_PROVENANCE = [
  'Seattle daily weather 2012–2015 from the vega-datasets npm package (data/seattle-weather.csv).',
  'Source: NOAA National Climatic Data Center, https://www.ncdc.noaa.gov/cdo-web/datatools/records',
  'Licence: U.S. Government Dataset (public domain), https://www.usa.gov/government-works; package BSD-3-Clause.',
];

/** Cuts the table into windows of `steps` consecutive days. Pure. */
export function windowWeather(
  text: string,
  file: string,
  steps: number,
  maxEpisodes: number,
): Episode[] {
  const table = parseNumericCsv(text, file, { textColumns: ['date'], ignoreColumns: ['weather'] });
  const idx = WEATHER_FEATURES.map((c) => table.columns.indexOf(c));
  const missing = WEATHER_FEATURES.filter((_, i) => idx[i]! < 0);
  if (missing.length > 0) {
    throw new DataError({
      code: 'missing-column',
      file,
      row: 1,
      index: `column '${missing[0]!}'`,
      message: `expected columns ${WEATHER_FEATURES.join(', ')}, got ${table.columns.join(', ')}`,
      hint: 'reinstall vega-datasets (npm ci)',
    });
  }
  const p = WEATHER_FEATURES.length;
  const count = Math.min(maxEpisodes, Math.floor(table.rows / steps));
  const episodes: Episode[] = [];
  for (let e = 0; e < count; e++) {
    const obs = new Float32Array(steps * p);
    for (let t = 0; t < steps; t++) {
      const r = e * steps + t;
      for (let j = 0; j < p; j++) obs[t * p + j] = table.data[r * table.columns.length + idx[j]!]!;
    }
    episodes.push({ obs, steps, obsDim: p });
  }
  return episodes;
}

function produce(config: DataConfig, _rng: unknown, io: DataIo): SourceData {
  const path = io.resolvePackageFile('vega-datasets', 'data/seattle-weather.csv');
  const file = 'vega-datasets/data/seattle-weather.csv';
  const episodes = windowWeather(io.readText(path), file, config.steps, config.episodes);
  return {
    name: 'seattle-weather',
    description: `Seattle daily weather (NOAA via vega-datasets), ${episodes.length} windows of ${config.steps} days`,
    obsDim: WEATHER_FEATURES.length,
    stateDim: 0,
    episodes,
    file,
    provenance: WEATHER_PROVENANCE,
  };
}

/** The seattle-weather source. */
export const seattleWeather: DataSourceImpl = {
  summary: 'real daily weather at Seattle 2012–2015 (NOAA, via the vega-datasets package)',
  produce,
};
