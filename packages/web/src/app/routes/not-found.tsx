import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { SignInButton } from '../../features/auth/components/sign-in-button';
import { appPaths } from '../../lib/paths';
import { useDocumentTitle } from '../../hooks/use-document-title';

interface RouteErrorData {
  what?: string;
  message?: string;
}

/** The route-level error screen: a missing or forbidden notebook, a lost session, a failed load. */
export function RouteError() {
  const error = useRouteError();
  const status = isRouteErrorResponse(error) ? error.status : null;
  const details = (isRouteErrorResponse(error) ? error.data : null) as RouteErrorData | null;
  const what = details?.what ?? 'This page';
  let title = 'Something went wrong';
  let text = 'The page could not be shown. Try again in a moment.';
  if (status === 404) {
    title = 'Nothing here';
    text = `${what} does not exist, or you do not have access to it. If someone shared it with you, ask them to check your role.`;
  } else if (status === 403) {
    title = 'Not allowed';
    text = `${what} is there, but your role does not allow this. ${details?.message ?? ''}`;
  } else if (status === 401) {
    title = 'Please sign in';
    text = 'Your session has ended. Sign in again to go on.';
  }
  useDocumentTitle(title);
  return (
    <div className="mx-auto max-w-xl space-y-4 px-6 py-16" data-testid="route-error" data-status={status ?? 'error'}>
      <h1 className="text-2xl font-semibold">{title}</h1>
      <p className="text-ink-soft">{text}</p>
      {status === 401 ? <SignInButton returnTo={window.location.pathname} /> : null}
      <p className="flex gap-4">
        <Link className="text-accent underline" to={appPaths.notebooks()}>
          Your notebooks
        </Link>
        <Link className="text-accent underline" to={appPaths.home()}>
          Back to the start
        </Link>
      </p>
    </div>
  );
}
