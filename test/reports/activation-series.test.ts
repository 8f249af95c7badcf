import { describe, expect, it } from 'vitest';
import { arrheniusSeries, eyringSeries } from '../../kinds/temperature-dependence/report/activation-series.ts';
import type { Refit } from '../../kinds/temperature-dependence/schemas.ts';

/**
 * The numbers of the sheet's Arrhenius and Eyring plots, against points computed here from the two
 * equations. Constants: R = 8.314462618 J K^-1 mol^-1 and k_B/h = 2.083661912e10 s^-1 K^-1, both from
 * the exact SI values of k_B, h and N_A (2019 SI).
 */
const R = 8.314462618;
const KB_OVER_H = 2.083661912e10;
const Ea = 50_000; // J mol^-1
const A = 1e10; // s^-1
const dH = 47_500; // J mol^-1
const dS = -60; // J K^-1 mol^-1
const temperatures = [290, 300, 310, 320];
const estimate = (value: number, unit: string) => ({ value, standardError: 0, ci95: [value, value] as [number, number], unit });
// Points that lie on the Arrhenius line; the Eyring plot is checked on its own points below.
const refit = (k: (T: number) => number): Refit =>
  ({
    Ea: estimate(Ea / 1000, 'kJ mol^-1'),
    A: estimate(A, 's^-1'),
    dH: estimate(dH / 1000, 'kJ mol^-1'),
    dS: estimate(dS, 'J K^-1 mol^-1'),
    points: temperatures.map((T) => ({ label: `${T} K`, temperatureK: T, kPerSecond: k(T) })),
  }) as Refit;
const arrheniusK = (T: number) => A * Math.exp(-Ea / (R * T));
const eyringK = (T: number) => KB_OVER_H * T * Math.exp(dS / R) * Math.exp(-dH / (R * T));
const at = (line: { intercept: number; slope: number }, x: number) => line.intercept + line.slope * x;

describe('the sheet’s Arrhenius and Eyring plots', () => {
  it('draws our Arrhenius line through points on ln k = ln A − E_a/(R T), with x = 1000 K / T', () => {
    const series = arrheniusSeries(refit(arrheniusK), { Ea: { value: '50', unit: 'kJ mol^-1' }, A: { value: '1e10', unit: 's^-1' } })!;
    expect(series.points.map((p) => p.x)).toEqual(temperatures.map((T) => 1000 / T));
    for (const p of series.points) expect(at(series.ourLine, p.x)).toBeCloseTo(p.y, 6);
    // The student's right values: their line is ours.
    expect(series.theirLine!.slope).toBeCloseTo(series.ourLine.slope, 9);
    expect(series.theirLine!.intercept).toBeCloseTo(Math.log(A), 9);
  });

  it('draws the student’s line from their reported values, in their units', () => {
    // Joules written as kilojoules: a line 1000 times as steep.
    const slip = arrheniusSeries(refit(arrheniusK), { Ea: { value: '50000', unit: 'kJ mol^-1' }, A: { value: '1e10', unit: 's^-1' } })!;
    expect(slip.theirLine!.slope / slip.ourLine.slope).toBeCloseTo(1000, 6);
    expect(arrheniusSeries(refit(arrheniusK), { Ea: { value: '50', unit: 'kJ mol^-1' } })!.note).toContain('not reported');
    expect(arrheniusSeries(refit(arrheniusK), { Ea: { value: '50', unit: 'kJ mol^-1' }, A: { value: '1e10', unit: 'furlongs' } })!.note).toContain('could not be read');
  });

  it('draws our Eyring line through points on ln(k/T) = ln(k_B/h) + ΔS‡/R − ΔH‡/(R T)', () => {
    const series = eyringSeries(refit(eyringK), { dH: { value: '47.5', unit: 'kJ mol^-1' }, dS: { value: '-60', unit: 'J K^-1 mol^-1' } })!;
    expect(series.points).toHaveLength(temperatures.length);
    for (const p of series.points) expect(at(series.ourLine, p.x)).toBeCloseTo(p.y, 6);
    expect(series.ourLine.slope).toBeCloseTo(-dH / (1000 * R), 9);
    // ΔS‡ with its sign flipped moves the intercept by 2 × 60 / R, the slope unchanged.
    const flipped = eyringSeries(refit(eyringK), { dH: { value: '47.5', unit: 'kJ mol^-1' }, dS: { value: '60', unit: 'J K^-1 mol^-1' } })!;
    expect(flipped.theirLine!.intercept - series.ourLine.intercept).toBeCloseTo(120 / R, 9);
    expect(flipped.theirLine!.slope).toBeCloseTo(series.ourLine.slope, 9);
  });
});
