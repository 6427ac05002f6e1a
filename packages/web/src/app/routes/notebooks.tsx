import type { LoaderFunctionArgs } from 'react-router-dom';
import { NotebooksTable } from '../../features/notebooks/components/notebooks-table';
import { requireMe } from '../loaders';
import { useDocumentTitle } from '../../hooks/use-document-title';

export async function notebooksLoader({ request }: LoaderFunctionArgs) {
  await requireMe(request);
  return null;
}

/** The notebooks the signed-in person can open. */
export function NotebooksRoute() {
  useDocumentTitle('Notebooks');
  return (
    <section className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">Notebooks</h1>
        <p className="text-ink-soft">Yours, those shared with you, and those opened by link.</p>
      </div>
      <NotebooksTable />
    </section>
  );
}
