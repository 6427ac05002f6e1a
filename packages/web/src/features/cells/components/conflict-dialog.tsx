/**
 * A save refused because someone saved first (409): both texts side by side, the lines that
 * differ marked, and the two ways out — keep mine as a new revision on top of theirs, or
 * take theirs. Nothing is lost either way: their text is already a revision, and mine
 * becomes one.
 */
import type { CellRevision } from '@rolloff/api/contract';
import { diffLines } from 'diff';
import { withFinalNewline } from './with-final-newline';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { exactTime } from '../../../lib/format-time';

interface Side {
  lines: { text: string; changed: boolean }[];
}

/** Splits two texts into their lines, marking those that are not in the other text. */
export function sideBySide(theirs: string, mine: string): { theirs: Side; mine: Side } {
  const left: Side = { lines: [] };
  const right: Side = { lines: [] };
  for (const part of diffLines(withFinalNewline(theirs), withFinalNewline(mine))) {
    const lines = part.value.replace(/\n$/, '').split('\n');
    if (!part.added) left.lines.push(...lines.map((text) => ({ text, changed: Boolean(part.removed) })));
    if (!part.removed) right.lines.push(...lines.map((text) => ({ text, changed: Boolean(part.added) })));
  }
  return { theirs: left, mine: right };
}

function TextColumn({ heading, side, tone, testId }: { heading: string; side: Side; tone: 'theirs' | 'mine'; testId: string }) {
  return (
    <section className="min-w-0" aria-label={heading}>
      <h3 className="mb-1 text-sm font-medium text-ink-soft">{heading}</h3>
      <pre data-testid={testId} className="max-h-96 overflow-auto rounded-lg border border-rule bg-sunken p-2 font-mono text-xs leading-5">
        {side.lines.map((line, i) => (
          <div key={i} className={line.changed ? (tone === 'theirs' ? 'bg-fail-soft' : 'bg-pass-soft') : ''} data-changed={line.changed || undefined}>
            {line.text || ' '}
          </div>
        ))}
      </pre>
    </section>
  );
}

export interface ConflictDialogProps {
  open: boolean;
  mine: string;
  theirs: CellRevision;
  onKeepMine: () => void;
  onTakeTheirs: () => void;
  /** Closes the dialog without choosing; the cell stays unsaved until a choice is made. */
  onDismiss: () => void;
}

/** The conflict dialog of one cell. */
export function ConflictDialog({ open, mine, theirs, onKeepMine, onTakeTheirs, onDismiss }: ConflictDialogProps) {
  const sides = sideBySide(theirs.text, mine);
  const who = theirs.author ? theirs.author.name || theirs.author.login : 'someone';
  return (
    <Dialog open={open} title="Someone else saved this cell first" onClose={onDismiss} width="max-w-4xl">
      <p className="mb-3 text-sm text-ink-soft">
        {who} saved revision {theirs.number} ({exactTime(theirs.createdAt)}) while you were typing. Your text is not lost: choose which text the cell goes on
        with.
      </p>
      <div className="grid gap-3 md:grid-cols-2">
        <TextColumn heading={`Theirs: revision ${theirs.number} by ${who}`} side={sides.theirs} tone="theirs" testId="conflict-theirs" />
        <TextColumn heading="Yours: not saved yet" side={sides.mine} tone="mine" testId="conflict-mine" />
      </div>
      <div className="mt-4 flex flex-wrap justify-end gap-2">
        <Button onClick={onTakeTheirs}>Take theirs</Button>
        <Button variant="primary" onClick={onKeepMine}>
          Keep mine as a new revision
        </Button>
      </div>
    </Dialog>
  );
}
