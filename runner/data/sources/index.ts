/**
 * The dataset map: adding a dataset means adding one file in this folder and one entry
 * here (plus its name in DataSource, runner/config/types.ts).
 */
import type { DataSource } from '../../config/types.ts';
import type { DataSourceImpl } from '../source.ts';
import { userFile } from './file.ts';
import { linearGaussian } from './linear-gaussian.ts';
import { lorenz } from './lorenz.ts';
import { roverMaze } from './rover-maze.ts';
import { seattleWeather } from './seattle-weather.ts';
import { swingingLamp } from './swinging-lamp.ts';

/** Every source by its config name. */
export const dataSources: Record<DataSource, DataSourceImpl> = {
  'linear-gaussian': linearGaussian,
  'rover-maze': roverMaze,
  'swinging-lamp': swingingLamp,
  lorenz,
  'seattle-weather': seattleWeather,
  file: userFile,
};
