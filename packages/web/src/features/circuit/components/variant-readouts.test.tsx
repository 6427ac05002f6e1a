import { STATUS_WORDS, analyze } from '@rolloff/solver';
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { formatReadout, plotSummary } from '../lib/readout-labels';
import { ReadoutsPanel } from './readouts-panel';
import { RequirementBadges } from './requirement-badges';
import { variantReadoutTables } from './variant-readouts';

/** An RC low-pass varied over three capacitors; corners 1.59 kHz, 159 Hz, 15.9 Hz. */
const CELL = `let C = 100nF
drive in
R1 [in out] 1k
C1 [out gnd] C
show out
vary C over 100n, 1u, 10u
require out corner >= 100 Hz
require out gain <= 0.1 dB`;

describe('readouts and requirements of a cell with variants', () => {
  afterEach(cleanup);
  const result = analyze(CELL);
  const variants = result.variants ?? [];

  it('gives each trace a table with a row per readout and a column per variant', () => {
    const [table] = variantReadoutTables(variants);
    expect(table.trace).toBe('out');
    const corner = table.rows.find((row) => row.name === 'corner');
    expect(corner?.cells.map((r) => r?.value)).toEqual(variants.map((v) => v.readouts.find((r) => r.name === 'corner')?.value));
  });

  it('draws the table with the variants as column headers and each value in its column', () => {
    render(<ReadoutsPanel readouts={result.readouts} variants={variants} />);
    const table = screen.getByRole('table');
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['readout', 'C = 100 nF', 'C = 1 µF', 'C = 10 µF']);
    const row = table.querySelector('[data-readout="corner"]') as HTMLElement;
    const cells = within(row)
      .getAllByRole('cell')
      .map((c) => c.textContent);
    expect(cells).toEqual(variants.map((v) => formatReadout(v.readouts.find((r) => r.name === 'corner')!)));
  });

  it('shows each requirement over every variant, then each variant’s own status', () => {
    render(<RequirementBadges requirements={result.requirements} variants={variants} />);
    const [corner, gain] = screen.getAllByTestId('requirement');
    expect(corner.dataset.status).toBe('fail');
    expect(
      within(corner)
        .getAllByTestId('variant-status')
        .map((v) => [v.dataset.status, v.textContent]),
    ).toEqual([
      ['pass', `${STATUS_WORDS.pass}C = 100 nF`],
      ['pass', `${STATUS_WORDS.pass}C = 1 µF`],
      ['fail', `${STATUS_WORDS.fail}C = 10 µF`],
    ]);
    expect(corner.textContent).toContain('with C = 10 µF');
    expect(gain.dataset.status).toBe('pass');
    expect(
      within(gain)
        .getAllByTestId('variant-status')
        .map((v) => v.dataset.status),
    ).toEqual(['pass', 'pass', 'pass']);
  });

  it('says what the plots show for each variant, for a screen reader', () => {
    const summary = plotSummary(result.traces, result.readouts, variants);
    expect(summary).toMatch(/^The plots show with C = 100 nF, out: .*corner 1\.592 kHz.*; with C = 1 µF, out: .*; with C = 10 µF, out: .*corner 15\.92 Hz/);
  });
});
