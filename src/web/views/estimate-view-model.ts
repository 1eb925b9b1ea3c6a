/** The pictures the estimate views draw, as computed by domain/estimate-charts.ts. */
import type { Chart, IntervalPicture } from '../../domain/estimate-charts.js';

export interface EstimateCharts {
  charts: Chart[];
  interval: IntervalPicture;
}
