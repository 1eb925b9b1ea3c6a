import { describe, expect, it } from 'vitest';
import type { Chart } from '../../src/domain/estimate-charts.js';
import { niceAxis } from '../../src/domain/estimate-charts.js';
import { chartTicks } from '../../src/worksheet/worksheet-ticks.js';

const chart = (id: string, x: number[], y: number[]): Chart => ({
  id,
  title: id,
  description: id,
  x: niceAxis(Math.min(...x), Math.max(...x)),
  y: niceAxis(Math.min(...y), Math.max(...y)),
  points: [],
});

describe('tick labels of the pictures', () => {
  it('prices in short form on price axes, plain numbers elsewhere', () => {
    const v = chartTicks(chart('price-living_area', [900, 3000], [150_000, 560_000]), 'USD', 'none');
    expect(v.xTicks).toEqual(['0', '1,000', '2,000', '3,000']);
    expect(v.yTicks).toEqual(['$100K', '$200K', '$300K', '$400K', '$500K', '$600K']);
  });
  it('a tick that is zero up to rounding prints as 0.0, never "-0.0"', () => {
    // The demo's log residual axis: the tick arithmetic leaves -5.55e-17 where 0 belongs.
    const c = chart('residuals', [150_000, 650_000], [-0.55, 0.55]);
    c.y = { label: 'Residual (log price)', min: -0.6, max: 0.6, ticks: [-0.6, -0.4, -0.2, -5.55111512313e-17, 0.2, 0.4, 0.6] };
    const v = chartTicks(c, 'EUR', 'log');
    expect(v.xTicks[0]).toMatch(/^€\d+K$/);
    expect(v.yTicks).toEqual(['-0.6', '-0.4', '-0.2', '0.0', '0.2', '0.4', '0.6']);
  });
});
