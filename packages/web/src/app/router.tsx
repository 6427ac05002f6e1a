import { createBrowserRouter } from 'react-router-dom';
import { HomeRoute } from './routes/home';
import { RouteError } from './routes/not-found';
import { RootLayout } from './routes/root-layout';

export const router = createBrowserRouter([
  {
    path: '/',
    element: <RootLayout />,
    errorElement: <RouteError />,
    children: [{ index: true, element: <HomeRoute /> }],
  },
]);
