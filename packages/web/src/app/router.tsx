import { createBrowserRouter, data } from 'react-router-dom';
import { HomeRoute, homeLoader } from './routes/home';
import { RouteError } from './routes/not-found';
import { NotebooksRoute, notebooksLoader } from './routes/notebooks';
import { RootLayout } from './routes/root-layout';
import { Loading } from '../components/ui/status-message';

// The notebook pages bring the editor, the solver and the plots: each is its own chunk.
export const router = createBrowserRouter([
  {
    path: '/',
    element: <RootLayout />,
    errorElement: <RouteError />,
    hydrateFallbackElement: <Loading />,
    children: [
      {
        errorElement: <RouteError />,
        children: [
          { index: true, element: <HomeRoute />, loader: homeLoader },
          { path: 'notebooks', element: <NotebooksRoute />, loader: notebooksLoader },
          { path: 'notebooks/:id', lazy: () => import('./routes/notebook') },
          { path: 'notebooks/:id/cells/:cellId/history', lazy: () => import('./routes/cell-history') },
          { path: 'notebooks/:id/versions', lazy: () => import('./routes/versions') },
          { path: 'notebooks/:id/versions/:number', lazy: () => import('./routes/version') },
          { path: 'notebooks/:id/reviews/:reviewId', lazy: () => import('./routes/review') },
          { path: 'notebooks/:id/activity', lazy: () => import('./routes/activity') },
          { path: 'settings', lazy: () => import('./routes/settings') },
          { path: 'admin', lazy: () => import('./routes/admin') },
          { path: 'help', lazy: () => import('./routes/help') },
          {
            path: '*',
            element: null,
            loader: () => {
              throw data({ what: 'This page' }, { status: 404 });
            },
          },
        ],
      },
    ],
  },
]);
