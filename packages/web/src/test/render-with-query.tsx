/** Renders a component for a test the way the app does: inside a TanStack Query provider. */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import type { RenderResult } from '@testing-library/react';
import type { ReactElement } from 'react';

/** A query client for one test: nothing is retried, so a refused request shows at once. */
export function testQueryClient(): QueryClient {
  return new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
}

/** Renders `ui` inside a provider of `client`: a fresh test client unless one (say, prefetched) is given. */
export function renderWithQuery(ui: ReactElement, client: QueryClient = testQueryClient()): RenderResult {
  return render(<QueryClientProvider client={client}>{ui}</QueryClientProvider>);
}
