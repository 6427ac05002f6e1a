import type { ReactNode } from 'react';

/** A spinner with a short text, for anything that is loading. */
export function Loading({ text = 'Loading…' }: { text?: string }) {
  return (
    <p role="status" className="flex items-center gap-2 py-6 text-sm text-ink-soft">
      <span aria-hidden className="h-4 w-4 animate-spin rounded-full border-2 border-rule border-t-accent" />
      {text}
    </p>
  );
}

/** What went wrong, in words, with an optional way to try again. */
export function ErrorMessage({ error, retry, children }: { error: unknown; retry?: () => void; children?: ReactNode }) {
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <div role="alert" className="rounded-lg border border-fail/40 bg-fail-soft px-4 py-3 text-sm text-fail">
      <p>{message}</p>
      {children}
      {retry ? (
        <button type="button" onClick={retry} className="mt-2 font-medium underline underline-offset-2">
          Try again
        </button>
      ) : null}
    </div>
  );
}

/** A friendly empty state with a next step. */
export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-xl border border-dashed border-rule bg-panel px-6 py-10 text-center">
      <p className="text-lg font-medium">{title}</p>
      <div className="mx-auto mt-2 max-w-md text-sm text-ink-soft">{children}</div>
    </div>
  );
}
