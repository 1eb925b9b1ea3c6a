/**
 * Tick labels of the worksheet's pictures: prices in short form ($300K), other axes as
 * plain numbers. Which axes carry prices follows from the chart: the price scatters' y,
 * the residual chart's fitted prices (and its residuals without a log transform), and the
 * interval picture.
 */
import type { Chart, IntervalPicture } from '../domain/estimate-charts.js';
import type { Transform } from '../domain/estimate-result.js';
import { priceCell } from './worksheet-cells.js';
import type { ChartView, IntervalView } from './worksheet-model.js';

const LOCALE = 'en-US';

const stepOf = (ticks: number[]) => (ticks.length > 1 ? Math.abs(ticks[1] - ticks[0]) : 1);

/** A tick that is zero up to rounding in the tick arithmetic (-5.6e-17) prints as 0, not "-0.0". */
const snap = (x: number, step: number) => (Math.abs(x) < step * 1e-6 ? 0 : x);

function compactMoney(currency: string, ticks: number[]): (x: number) => string {
  const f = new Intl.NumberFormat(LOCALE, { style: 'currency', currency, notation: 'compact', minimumFractionDigits: 0, maximumFractionDigits: 2 });
  const step = stepOf(ticks);
  return (x) => f.format(snap(x, step));
}

function plainNumber(ticks: number[]): (x: number) => string {
  // Enough decimals to tell neighbouring ticks apart, no more.
  const step = stepOf(ticks);
  const decimals = step >= 1 ? 0 : Math.min(6, Math.ceil(-Math.log10(step) - 1e-9));
  const f = new Intl.NumberFormat(LOCALE, { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
  return (x) => f.format(snap(x, step));
}

export function chartTicks(chart: Chart, currency: string, transform: Transform): ChartView {
  const xMoney = chart.id === 'residuals';
  const yMoney = chart.id.startsWith('price-') || (chart.id === 'residuals' && transform === 'none');
  const yTicks = chart.y?.ticks ?? [];
  const xFormat = xMoney ? compactMoney(currency, chart.x.ticks) : plainNumber(chart.x.ticks);
  const yFormat = yMoney ? compactMoney(currency, yTicks) : plainNumber(yTicks);
  return {
    chart,
    xTicks: chart.x.ticks.map(xFormat),
    yTicks: yTicks.map(yFormat),
  };
}

export function intervalTicks(picture: IntervalPicture, currency: string): IntervalView {
  const money = compactMoney(currency, picture.axis.ticks);
  const price = (x: number) => priceCell(x, currency).text;
  return {
    picture,
    ticks: picture.axis.ticks.map(money),
    valueText: price(picture.value),
    confidenceText: [price(picture.confidence[0]), price(picture.confidence[1])],
    predictionText: [price(picture.prediction[0]), price(picture.prediction[1])],
  };
}
