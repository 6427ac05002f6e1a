import { lazy, Suspense } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { redirect, useSearchParams } from 'react-router-dom';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { meQueryOptions } from '../../features/auth/api/get-me';
import { SignInButton } from '../../features/auth/components/sign-in-button';
import { PlotPlaceholder } from '../../features/circuit/components/lazy-parts';
import { HealthStatus } from '../../features/health/components/health-status';
import { appPaths } from '../../lib/paths';
import { queryClient } from '../query-client';
import { useDocumentTitle } from '../../hooks/use-document-title';

// The example brings the solver's formatting and the plot; the page's words come first.
const ExamplePlot = lazy(() => import('../../features/circuit/components/example-plot').then((m) => ({ default: m.ExamplePlot })));

/** Signed-in people go straight to their notebooks. */
export async function homeLoader({ request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
  if (me) {
    const returnTo = new URL(request.url).searchParams.get('returnTo');
    throw redirect(returnTo && returnTo.startsWith('/') && !returnTo.startsWith('//') ? returnTo : appPaths.notebooks());
  }
  return null;
}

/** The landing page for people who are not signed in. */
export function HomeRoute() {
  useDocumentTitle('Filter design notebooks');
  const [params] = useSearchParams();
  const returnTo = params.get('returnTo') ?? undefined;
  return (
    <section className="grid items-start gap-10 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
      <div className="space-y-6 lg:pt-8">
        <h1 className="text-3xl font-semibold tracking-tight">Filter design notebooks for analog engineers</h1>
        <p className="max-w-2xl text-lg text-ink-soft">
          Write each candidate network as a short component list, see its Bode plot, corners and margins as you type, and check it against the requirements you
          wrote down.
        </p>
        <p className="max-w-2xl text-lg text-ink-soft">Every revision is kept, so a colleague can fork it, review a frozen version and sign it off.</p>
        <div className="flex flex-wrap items-center gap-4">
          <SignInButton returnTo={returnTo} />
          <HealthStatus />
        </div>
        {returnTo ? <p className="text-sm text-ink-faint">Sign in to open the page you asked for.</p> : null}
      </div>
      <figure className="space-y-2">
        <Suspense fallback={<PlotPlaceholder text="Loading an example plot…" />}>
          <ExamplePlot text={FIRST_EXAMPLE} filename="rolloff-example" />
        </Suspense>
        <figcaption className="text-sm text-ink-faint">
          A real result: a unity-gain second-order low-pass at 1 kHz, solved in your browser by the same solver a notebook uses.
        </figcaption>
      </figure>
    </section>
  );
}
