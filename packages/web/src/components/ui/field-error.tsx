import type { ReactNode } from 'react';

/** A form field's problem, read out when it appears; its field names it with `fieldProblem`. */
export function FieldError({ id, children }: { id: string; children: ReactNode }) {
  return (
    <p id={id} role="alert" className="text-sm text-fail">
      {children}
    </p>
  );
}

/** The attributes that tie a field to the FieldError `errorId` while it has a problem. */
export function fieldProblem(errorId: string, problem: unknown): { 'aria-invalid'?: true; 'aria-describedby'?: string } {
  return problem ? { 'aria-invalid': true, 'aria-describedby': errorId } : {};
}
