/**
 * A note cell: its Markdown rendered, and for editors edited in place (a click on "Edit",
 * a double-click, or Enter on the rendered note). Shift-Enter finishes and goes to the next
 * cell; Escape finishes.
 */
import { useEffect, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { MarkdownView } from '../../../components/ui/markdown-view';

export interface NoteCellProps {
  text: string;
  onChange: (text: string) => void;
  editable: boolean;
  onLeave: () => void;
  label: string;
  startEditing?: boolean;
}

/** One note cell. */
export function NoteCell({ text, onChange, editable, onLeave, label, startEditing = false }: NoteCellProps) {
  const [editing, setEditing] = useState(startEditing && editable);
  const area = useRef<HTMLTextAreaElement>(null);
  const view = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (editing) area.current?.focus();
  }, [editing]);

  const finish = (next: 'stay' | 'leave') => {
    setEditing(false);
    if (next === 'leave') onLeave();
    else requestAnimationFrame(() => view.current?.focus());
  };

  if (editing) {
    return (
      <div className="space-y-2">
        <textarea
          ref={area}
          value={text}
          aria-label={`${label}, Markdown text`}
          onChange={(event) => onChange(event.target.value)}
          onKeyDown={(event) => {
            if (event.key === 'Enter' && event.shiftKey) {
              event.preventDefault();
              finish('leave');
            } else if (event.key === 'Escape') {
              event.preventDefault();
              finish('stay');
            }
          }}
          rows={Math.max(4, text.split('\n').length + 1)}
          className="w-full rounded-lg border border-rule bg-panel p-3 font-mono text-sm text-ink"
          placeholder="Write a note in Markdown: # a heading, *emphasis*, - a list…"
        />
        <div className="flex items-center gap-2 text-xs text-ink-faint">
          <Button size="sm" onClick={() => finish('stay')}>
            Done
          </Button>
          Markdown · Escape finishes · Shift-Enter goes to the next cell
        </div>
      </div>
    );
  }
  return (
    <div
      ref={view}
      tabIndex={0}
      data-focus-target
      aria-label={editable ? `${label}: press Enter to edit` : label}
      onDoubleClick={() => editable && setEditing(true)}
      onKeyDown={(event) => {
        if (event.key === 'Enter' && event.shiftKey) {
          event.preventDefault();
          onLeave();
        } else if (event.key === 'Enter' && editable) {
          event.preventDefault();
          setEditing(true);
        }
      }}
      className="rounded-lg px-1 py-1"
    >
      {text.trim() ? (
        <MarkdownView text={text} />
      ) : (
        <p className="text-sm italic text-ink-faint">{editable ? 'An empty note: press Enter or double-click to write.' : 'An empty note.'}</p>
      )}
      {editable ? (
        <Button size="sm" variant="quiet" className="mt-1" onClick={() => setEditing(true)}>
          Edit note
        </Button>
      ) : null}
    </div>
  );
}
