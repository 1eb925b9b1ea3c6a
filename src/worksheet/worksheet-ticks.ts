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

function compactMoney(currency: string): (x: number) => string {
  const f = new Intl.NumberFormat(LOCALE, { style: 'currency', currency, notation: 'compact', minimumFractionDigits: 0, maximumFractionDigits: 2 });
  return (x) => f.format(x === 0 ? 0 : x);
}

function plainNumber(ticks: number[]): (x: number) => string {
  // Enough decimals to tell neighbouring ticks apart, no more.
  const step = ticks.length > 1 ? Math.abs(ticks[1] - ticks[0]) : 1;
  const decimals = step >= 1 ? 0 : Math.min(6, Math.ceil(-Math.log10(step) - 1e-9));
  const f = new Intl.NumberFormat(LOCALE, { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
  return (x) => f.format(x === 0 ? 0 : x);
}

export function chartTicks(chart: Chart, currency: string, transform: Transform): ChartView {
  const money = compactMoney(currency);
  const xMoney = chart.id === 'residuals';
  const yMoney = chart.id.startsWith('price-') || (chart.id === 'residuals' && transform === 'none');
  const xFormat = xMoney ? money : plainNumber(chart.x.ticks);
  const yFormat = yMoney ? money : plainNumber(chart.y?.ticks ?? []);
  return {
    chart,
    xTicks: chart.x.ticks.map(xFormat),
    yTicks: (chart.y?.ticks ?? []).map(yFormat),
  };
}

export function intervalTicks(picture: IntervalPicture, currency: string): IntervalView {
  const money = compactMoney(currency);
  const price = (x: number) => priceCell(x, currency).text;
  return {
    picture,
    ticks: picture.axis.ticks.map(money),
    valueText: price(picture.value),
    confidenceText: [price(picture.confidence[0]), price(picture.confidence[1])],
    predictionText: [price(picture.prediction[0]), price(picture.prediction[1])],
  };
}
