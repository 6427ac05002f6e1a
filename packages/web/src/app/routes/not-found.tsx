import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';

/** The route-level error screen: a missing page or a failed load. */
export function RouteError() {
  const error = useRouteError();
  const missing = isRouteErrorResponse(error) && error.status === 404;
  return (
    <div className="mx-auto max-w-xl space-y-4 px-6 py-16">
      <h1 className="text-2xl font-semibold">{missing ? 'Nothing here' : 'Something went wrong'}</h1>
      <p className="text-ink-soft">
        {missing ? 'This page does not exist, or you do not have access to it.' : 'The page could not be shown. Try again in a moment.'}
      </p>
      <Link className="text-accent underline" to="/">
        Back to the start
      </Link>
    </div>
  );
}
