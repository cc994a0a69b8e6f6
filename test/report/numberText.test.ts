// src/report/numberText.ts: numbers and p-values as every face shows them (Cutline's own
// presentation rules: four significant digits, p-values to three decimals, "p < 0.001" below).
import { interval, num, pIs, pval } from '../../src/report/numberText';

test('num and interval: four significant digits, plain notation for everyday magnitudes', () => {
  expect(num(-179.8342)).toBe('-179.8');
  expect(num(0.012345)).toBe('0.01235');
  expect(num(2.5e6)).toBe('2.500e+6');
  expect(interval([1.23456, 2])).toBe('[1.235, 2.000]');
});

test('pval and pIs: one wording of a p-value for the command line, the reports and the summary sheet', () => {
  expect(pval(0.0312)).toBe('0.031');
  expect(pval(0.00042)).toBe('<0.001');
  expect(pIs(0.0312)).toBe('p = 0.031');
  expect(pIs(0.001)).toBe('p = 0.001');
  expect(pIs(0.00042)).toBe('p < 0.001');
  expect(pIs(1)).toBe('p = 1.000');
});
