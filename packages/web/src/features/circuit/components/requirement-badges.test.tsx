import { FIRST_EXAMPLE, STATUS_WORDS, analyze } from '@rolloff/solver';
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { RequirementBadges } from './requirement-badges';

describe('requirement badges', () => {
  afterEach(cleanup);

  it('read pass, fail and n/a as the solver words them, with what was measured in its unit', () => {
    const text = FIRST_EXAMPLE.replace('require out gain >= -0.3 dB over 10 .. 500', 'require out gain >= -0.1 dB over 10 .. 700');
    // The step of C2's current settles to 0, so its overshoot (a fraction of the final value) cannot be measured.
    const result = analyze(`${text}\nshow step current C2\nrequire "step current C2" overshoot <= 5%`);
    expect(result.requirements.map((q) => q.status)).toEqual(['fail', 'pass', 'pass', 'not-applicable']);
    render(<RequirementBadges requirements={result.requirements} />);
    const items = screen.getAllByTestId('requirement');
    expect(items.map((item) => item.dataset.status)).toEqual(['fail', 'pass', 'pass', 'not-applicable']);
    const words = items.map((item) => item.querySelector('span')?.textContent?.trim());
    expect(words).toEqual([STATUS_WORDS.fail, STATUS_WORDS.pass, STATUS_WORDS.pass, STATUS_WORDS['not-applicable']]);
    expect(items[0].textContent).toMatch(/worst -0\.\d+ dB at /);
    expect(items[1].textContent).toMatch(/\d kHz$|\d Hz$/);
    expect(items[3].textContent).toContain(`not checked: ${result.requirements[3].reason}`);
    expect(result.requirements[3].reason).toMatch(/final value is 0/);
    expect(screen.getByRole('heading').textContent).toBe(`Requirements · 1 of 4 ${STATUS_WORDS.fail}, 1 ${STATUS_WORDS['not-applicable']}`);
  });
});
