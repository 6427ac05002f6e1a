import { analyze } from '@rolloff/solver';
import type { Result } from '@rolloff/solver';
import type { Annotations } from 'plotly.js-basic-dist-min';
import { describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { bodeFigure, shapesOf } from '../../../test/plot-figures';
import { loopMarginMarks, marginReference, marginText } from './loop-margins';
import type { Figure } from './figure-style';

/**
 * The follower loop of reference-values.md §9 (OA-PM): L(s) = 10⁵ / ((1 + s/2π·10)(1 + s/2π·10⁶)),
 * two buffered lags. Its phase never reaches −180°, so its gain margin is unbounded.
 */
const FOLLOWER_LOOP = `drive x
R1 [x a] 1k
C1 [a gnd] (1/(2*pi*10*1k))
A1 [b gnd a gnd] vgain 1e5
R2 [b c] 1k
C2 [c gnd] (1/(2*pi*1M*1k))
show loop c / x
sweep 1 .. 100M
`;

/** Three equal RC lags (τ = 100 µs), buffered, behind a flat gain K = 4. */
const THREE_LAGS = `drive x
R1 [x a] 1k
C1 [a gnd] 100n
A1 [b gnd a gnd] vgain 1
R2 [b c] 1k
C2 [c gnd] 100n
A2 [d gnd c gnd] vgain 1
R3 [d e] 1k
C3 [e gnd] 100n
A3 [out gnd e gnd] vgain 4
show loop out / x
sweep 10 .. 1M
`;

const bodeOf = (result: Result): Figure => bodeFigure([{ result }]);
const annotationsOf = (figure: Figure) => (figure.layout.annotations ?? []) as Partial<Annotations>[];
const readoutOf = (result: Result, name: string) => {
  const found = result.readouts.find((r) => r.name === name);
  if (!found) throw new Error(`no ${name} readout`);
  return found;
};
const readout = (result: Result, name: string) => readoutOf(result, name).value;

describe('loop margins on the Bode plot', () => {
  const follower = analyze(FOLLOWER_LOOP);
  const followerFigure = bodeOf(follower);
  const crossover = readout(follower, 'crossover');
  const phaseMargin = readout(follower, 'phase-margin');

  const lags = analyze(THREE_LAGS);
  const lagsFigure = bodeOf(lags);
  const phaseCrossover = readout(lags, 'phase-crossover');
  const gainMargin = readout(lags, 'gain-margin');

  it('draws them from the solver’s readouts of the loops, at the crossovers the margins carry', () => {
    expect(readoutOf(follower, 'phase-margin').at).toBe(crossover);
    expect(readoutOf(lags, 'gain-margin').at).toBe(phaseCrossover);
    for (const result of [follower, lags]) {
      expect(result.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
      expect(result.traces.map((t) => t.kind)).toEqual(['loop']);
    }
    // reference-values.md §9, OA-PM (follower, 2nd pole at GBW): f_c = 786 151.4 Hz, PM = 51.82802°.
    expect(crossover / 786_151.4).toBeCloseTo(1, 6);
    expect(phaseMargin).toBeCloseTo(51.82802, 4);
    // Derived by hand from T(jω) = K/(1 + jωτ)³: the phase is −180° at ωτ = √3, where each lag
    // is down to 1/2, so |T| = K/8 and GM = 20·log10(8/K) = 6.0206 dB for K = 4.
    expect(phaseCrossover).toBeCloseTo(Math.sqrt(3) / (2 * Math.PI * 1e-4), 1);
    expect(gainMargin).toBeCloseTo(20 * Math.log10(2), 3);
  });

  it('draws the phase margin as a bar at the crossover, from −180° up to the phase, with its value', () => {
    const bar = shapesOf(followerFigure).find((s) => s.yref === 'y2' && s.x0 === crossover && s.x1 === crossover);
    expect(bar).toBeDefined();
    expect(Number(bar?.y0)).toBe(-180);
    expect(Number(bar?.y1) - Number(bar?.y0)).toBeCloseTo(phaseMargin, 9);
    const label = annotationsOf(followerFigure).find((a) => String(a.text).startsWith('phase margin'));
    expect(label).toMatchObject({ yref: 'y2', text: marginText(readoutOf(follower, 'phase-margin')), showarrow: true });
    expect(label?.text).toBe('phase margin 51.83° at 786.2 kHz');
    // On a log axis Plotly places annotations by the logarithm of the value.
    expect(label?.x).toBeCloseTo(Math.log10(crossover), 12);
    expect(label?.y).toBeCloseTo(-180 + phaseMargin, 9);
  });

  it('draws the gain margin as a bar at the phase crossover, from |T| up to 0 dB, with its value', () => {
    const bar = shapesOf(lagsFigure).find((s) => s.yref === 'y' && s.x0 === phaseCrossover && s.x1 === phaseCrossover);
    expect(bar).toMatchObject({ y0: -gainMargin, y1: 0 });
    const label = annotationsOf(lagsFigure).find((a) => String(a.text).startsWith('gain margin'));
    expect(label).toMatchObject({ yref: 'y', text: marginText(readoutOf(lags, 'gain-margin')), y: -gainMargin });
    expect(label?.text).toMatch(/^gain margin 6\.02\d* dB at 2\.75\d* kHz$/);
    expect(label?.x).toBeCloseTo(Math.log10(phaseCrossover), 12);
  });

  it('keeps the vertical markers at the crossovers and draws the 0 dB and −180° lines the margins are read from', () => {
    expect(shapesOf(followerFigure).some((s) => s.yref === 'paper' && s.x0 === crossover && s.x1 === crossover)).toBe(true);
    expect(shapesOf(lagsFigure).some((s) => s.yref === 'paper' && s.x0 === phaseCrossover && s.x1 === phaseCrossover)).toBe(true);
    const ends = { x0: lags.frequencies[0], x1: lags.frequencies[lags.frequencies.length - 1] };
    expect(shapesOf(lagsFigure).find((s) => s.yref === 'y' && s.y0 === 0 && s.y1 === 0)).toMatchObject(ends);
    expect(shapesOf(lagsFigure).find((s) => s.yref === 'y2' && s.y0 === -180 && s.y1 === -180)).toMatchObject(ends);
  });

  it('says so when the phase never reaches −180° in the sweep, and draws no gain-margin bar', () => {
    expect(readout(follower, 'gain-margin')).toBe(Infinity);
    expect(annotationsOf(followerFigure).map((a) => a.text)).toContain('gain margin ∞: the phase never reaches −180° in the sweep');
    expect(shapesOf(followerFigure).filter((s) => s.yref === 'y' && s.y1 === 0 && s.x0 === s.x1)).toEqual([]);
  });

  it('marks nothing on a trace that is not a loop gain', () => {
    const filter = analyze(FIRST_EXAMPLE);
    expect(loopMarginMarks(filter.traces[0], filter.readouts, filter.frequencies, '#000001', '#ffffff')).toEqual({ shapes: [], annotations: [] });
    expect(annotationsOf(bodeOf(filter)).some((a) => /margin/.test(String(a.text)))).toBe(false);
  });
});

describe('marginReference', () => {
  it('is the odd multiple of 180° the phase margin is measured from, even after unwrapping', () => {
    expect(marginReference(-95.6, 84.4)).toBe(-180);
    expect(marginReference(-455, 85)).toBe(-540);
    expect(marginReference(200, 20)).toBe(180);
  });
});
