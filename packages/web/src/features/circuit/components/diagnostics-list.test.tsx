import { analyze } from '@rolloff/solver';
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { problemsOf } from '../lib/cautions';
import { DiagnosticsList } from './diagnostics-list';

describe('the list of a cell’s diagnostics', () => {
  afterEach(cleanup);

  it('counts errors, warnings and notes apart, each by its severity', () => {
    render(
      <DiagnosticsList
        diagnostics={[
          { severity: 'error', line: 1, column: 1, endColumn: 2, message: 'a', code: 'x' },
          { severity: 'warning', line: 2, column: 1, endColumn: 2, message: 'b', code: 'y' },
          { severity: 'warning', line: 3, column: 1, endColumn: 2, message: 'c', code: 'y' },
          { severity: 'info', line: 4, column: 1, endColumn: 2, message: 'd', code: 'z' },
        ]}
      />,
    );
    expect(screen.getByTestId('diagnostics').querySelector('summary')?.textContent).toBe('1 error, 2 warnings, 1 note');
  });

  it('leaves the hazardous-voltage caution to its banner', () => {
    const result = analyze('drive in 230\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out\n');
    render(<DiagnosticsList diagnostics={problemsOf(result.diagnostics)} />);
    expect(screen.queryByTestId('diagnostics')).toBeNull();
  });
});
