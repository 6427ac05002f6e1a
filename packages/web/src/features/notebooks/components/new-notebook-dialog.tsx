/** "New notebook": a title, and optionally a first circuit cell to start from. */
import { TitleSchema } from '@rolloff/api/contract';
import { useId, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { FieldError, fieldProblem } from '../../../components/ui/field-error';
import { ErrorMessage } from '../../../components/ui/status-message';
import { appPaths } from '../../../lib/paths';
import { useCreateNotebook } from '../api/create-notebook';

/** A small network of our own to start from: a first-order RC low-pass near 1 kHz. */
export const STARTER_CIRCUIT = `# A first-order RC low-pass: change a value and watch the plot
let R = 1.6k
let C = 100n

drive in
R1 [in out]   R   ±1%
C1 [out gnd]  C   ±5%

show out
require out corner = 1k ± 5%
`;

/** The button and its dialog. */
export function NewNotebookButton({ variant = 'primary' }: { variant?: 'primary' | 'secondary' }) {
  const [open, setOpen] = useState(false);
  const [title, setTitle] = useState('');
  const [starter, setStarter] = useState(true);
  const [problem, setProblem] = useState<string | null>(null);
  const create = useCreateNotebook();
  const navigate = useNavigate();
  const titleId = useId();

  return (
    <>
      <Button variant={variant} onClick={() => setOpen(true)}>
        New notebook
      </Button>
      <Dialog open={open} title="New notebook" onClose={() => setOpen(false)}>
        <form
          className="space-y-4"
          onSubmit={(event) => {
            event.preventDefault();
            const parsed = TitleSchema.safeParse(title);
            if (!parsed.success) {
              setProblem(parsed.error.issues[0]?.message ?? 'The title is not valid.');
              return;
            }
            setProblem(null);
            create.mutate(
              { title: parsed.data, cells: starter ? [{ kind: 'circuit', text: STARTER_CIRCUIT }] : [{ kind: 'circuit', text: '' }] },
              {
                onSuccess: (notebook) => {
                  setOpen(false);
                  navigate(appPaths.notebook(notebook.id));
                },
              },
            );
          }}
        >
          <div className="space-y-1">
            <label htmlFor={titleId} className="block text-sm font-medium">
              Title
            </label>
            <input
              id={titleId}
              value={title}
              onChange={(event) => setTitle(event.target.value)}
              placeholder="e.g. Anti-alias filter for the vibration ADC"
              {...fieldProblem(`${titleId}-problem`, problem)}
              className="w-full rounded-md border border-rule bg-panel px-3 py-2"
              autoFocus
            />
            {problem ? <FieldError id={`${titleId}-problem`}>{problem}</FieldError> : null}
          </div>
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={starter} onChange={(event) => setStarter(event.target.checked)} />
            Start with an example circuit cell (an RC low-pass near 1 kHz)
          </label>
          {create.error ? <ErrorMessage error={create.error} /> : null}
          <div className="flex justify-end gap-2">
            <Button onClick={() => setOpen(false)}>Cancel</Button>
            <Button type="submit" variant="primary" disabled={create.isPending}>
              {create.isPending ? 'Creating…' : 'Create notebook'}
            </Button>
          </div>
        </form>
      </Dialog>
    </>
  );
}
