/**
 * What route loaders share: the signed-in person (or a trip to the landing page), and the
 * API's 404/403 turned into route errors that the error screen explains.
 */
import type { Me } from '@rolloff/api/contract';
import { data, redirect } from 'react-router-dom';
import { meQueryOptions } from '../features/auth/api/get-me';
import { ApiError } from '../lib/api-client';
import { appPaths } from '../lib/paths';
import { queryClient } from './query-client';

/** The signed-in person; anyone else is sent to the landing page, to come back after sign-in. */
export async function requireMe(request: Request): Promise<Me> {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (!me) {
    const url = new URL(request.url);
    throw redirect(`${appPaths.home()}?returnTo=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return me;
}

/** Runs a load; a 404, 403 or 401 from the API becomes the matching route error. */
export async function orRouteError<T>(load: Promise<T>, what = 'This notebook'): Promise<T> {
  try {
    return await load;
  } catch (error) {
    if (error instanceof ApiError && [401, 403, 404].includes(error.status)) {
      throw data({ what, message: error.message }, { status: error.status });
    }
    throw error;
  }
}
