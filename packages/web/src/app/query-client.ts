/** The app's one query cache, shared by the router's loaders and the components. */
import { QueryClient } from '@tanstack/react-query';
import { ApiError } from '../lib/api-client';

export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 10_000,
      // A missing, forbidden or refused resource will not appear by asking again.
      retry: (failures, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && failures < 2,
    },
  },
});
