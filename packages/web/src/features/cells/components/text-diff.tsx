import { diffLines } from 'diff';
import { withFinalNewline } from './with-final-newline';

/** The line-by-line difference between two texts, removed lines marked − and added +. */
export function TextDiff({ before, after }: { before: string; after: string }) {
  const parts = diffLines(withFinalNewline(before), withFinalNewline(after));
  const changed = parts.some((p) => p.added || p.removed);
  if (!changed) return <p className="text-sm text-ink-faint">The two texts are the same.</p>;
  return (
    <pre data-testid="text-diff" className="overflow-auto rounded-lg border border-rule bg-sunken p-2 font-mono text-xs leading-5">
      {parts.flatMap((part, i) =>
        part.value
          .replace(/\n$/, '')
          .split('\n')
          .map((line, j) => (
            <div
              key={`${i}-${j}`}
              data-change={part.added ? 'added' : part.removed ? 'removed' : undefined}
              className={part.added ? 'bg-pass-soft text-ink' : part.removed ? 'bg-fail-soft text-ink' : 'text-ink-soft'}
            >
              <span aria-hidden className="mr-2 inline-block w-3 select-none text-ink-faint">
                {part.added ? '+' : part.removed ? '−' : ' '}
              </span>
              {line || ' '}
            </div>
          )),
      )}
    </pre>
  );
}
