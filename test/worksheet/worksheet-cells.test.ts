import { describe, expect, it } from 'vitest';
import {
  fixedCell,
  integerCell,
  moneyRateCell,
  percentCell,
  priceCell,
  pValueCell,
  quantityCell,
  roundTo,
  signedPriceCell,
  significantCell,
} from '../../src/worksheet/worksheet-cells.js';

describe('worksheet cells: one figure, one rounding, in the text and the number', () => {
  it('prices round to the currency unit, with no negative zero', () => {
    expect(priceCell(335749.9875, 'USD')).toEqual({ text: '$335,750', value: 335750, unit: 'USD' });
    expect(priceCell(1234.5, 'EUR')).toEqual({ text: '€1,235', value: 1235, unit: 'EUR' });
    expect(priceCell(-0.4, 'USD').text).toBe('$0');
    expect(priceCell(12.7, 'JPY').text).toBe('¥13');
    expect(priceCell(null, 'USD')).toEqual({ text: '' });
    expect(priceCell(Number.NaN, 'USD')).toEqual({ text: '' });
  });

  it('adjustments carry their sign', () => {
    expect(signedPriceCell(4500.2, 'USD').text).toBe('+$4,500');
    expect(signedPriceCell(-2300.5, 'USD')).toEqual({ text: '-$2,301', value: -2301, unit: 'USD' });
    expect(signedPriceCell(0.3, 'USD').text).toBe('$0');
  });

  it('money rates keep four significant digits and drop trailing zeros', () => {
    expect(moneyRateCell(112.3456, 'USD')).toEqual({ text: '$112.3', value: 112.3, unit: 'USD' });
    expect(moneyRateCell(88.7123, 'USD').text).toBe('$88.71');
    expect(moneyRateCell(1.80001, 'USD').text).toBe('$1.8');
    expect(moneyRateCell(0.0123456, 'USD')).toEqual({ text: '$0.01235', value: 0.01235, unit: 'USD' });
    expect(moneyRateCell(-606.04, 'USD').text).toBe('-$606');
    expect(moneyRateCell(16193.4, 'USD').text).toBe('$16,193');
  });

  it('plain numbers, percentages and p values', () => {
    expect(fixedCell(0.20998, 4)).toEqual({ text: '0.2100', value: 0.21 });
    expect(fixedCell(-0.0004, 3).text).toBe('0.000');
    expect(significantCell(0.000268712, 4)).toEqual({ text: '0.0002687', value: 0.0002687 });
    expect(integerCell(1850)).toEqual({ text: '1,850', value: 1850 });
    expect(quantityCell(2.5)).toEqual({ text: '2.5', value: 2.5 });
    expect(quantityCell(6500, 'sq ft')).toEqual({ text: '6,500 sq ft', value: 6500, unit: 'sq ft' });
    expect(percentCell(12.345)).toEqual({ text: '12.3 %', value: 12.3, unit: '%' });
    expect(pValueCell(0.00002)).toEqual({ text: '<0.0001' });
    expect(pValueCell(0.04567)).toEqual({ text: '0.0457', value: 0.0457 });
  });

  it('rounds half away from zero', () => {
    expect(roundTo(2.5, 0)).toBe(3);
    expect(roundTo(-2.5, 0)).toBe(-3);
    expect(roundTo(0.125, 2)).toBe(0.13);
    expect(Object.is(roundTo(-0.001, 2), 0)).toBe(true);
  });
});
