import { FIRST_EXAMPLE, HAZARDOUS_VOLTAGE, analyze } from '@rolloff/solver';
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { cautionsOf, problemsOf, sentence } from '../lib/cautions';
import { HazardCaution } from './hazard-caution';

const MAINS = 'let Vline = 230\ndrive in Vline  # mains input\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out\n';

describe('the hazardous-voltage caution', () => {
  afterEach(cleanup);

  it('shows the solver’s caution in its words, and nothing for a signal-level cell', () => {
    const result = analyze(MAINS);
    const cautions = cautionsOf(result.diagnostics);
    expect(cautions.map((d) => d.code)).toEqual([HAZARDOUS_VOLTAGE]);
    render(<HazardCaution cautions={cautions} />);
    const note = screen.getByTestId('hazard-caution');
    // The drive is a parameter: the solver reads the network, so the web has nothing to parse.
    expect(note.textContent).toContain(sentence(cautions[0].message));
    expect(note.textContent).toContain('its drive is 230 V, above 50 V AC; it mentions mains');
    expect(note.textContent).toContain('local electrical codes and licensed practice');
    cleanup();
    render(<HazardCaution cautions={cautionsOf(analyze(FIRST_EXAMPLE).diagnostics)} />);
    expect(screen.queryByTestId('hazard-caution')).toBeNull();
  });

  it('is kept out of the list of the cell’s problems', () => {
    const result = analyze(MAINS);
    expect(problemsOf(result.diagnostics).some((d) => d.code === HAZARDOUS_VOLTAGE)).toBe(false);
    expect(problemsOf(result.diagnostics).length + cautionsOf(result.diagnostics).length).toBe(result.diagnostics.length);
  });

  it('writes a solver message as a sentence', () => {
    expect(sentence('such circuits can give a lethal shock')).toBe('Such circuits can give a lethal shock.');
    expect(sentence('Already one.')).toBe('Already one.');
  });
});
