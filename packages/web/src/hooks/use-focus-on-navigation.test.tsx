import { cleanup, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { Link, Outlet, RouterProvider, createMemoryRouter } from 'react-router-dom';
import { useDocumentTitle } from './use-document-title';
import { useFocusOnNavigation } from './use-focus-on-navigation';

function Frame() {
  useFocusOnNavigation();
  return (
    <main>
      <Link to="/versions">Versions</Link>
      <Outlet />
    </main>
  );
}

function Page({ title }: { title: string }) {
  useDocumentTitle(title, 'Anti-alias filter');
  return <h1>{title}</h1>;
}

describe('moving to another page', () => {
  afterEach(cleanup);

  it('puts the focus on the new page’s heading and names the page in the title, but not on the first load', async () => {
    const router = createMemoryRouter(
      [
        {
          path: '/',
          element: <Frame />,
          children: [
            { index: true, element: <Page title="Notebook" /> },
            { path: 'versions', element: <Page title="Versions" /> },
          ],
        },
      ],
      { initialEntries: ['/'] },
    );
    render(<RouterProvider router={router} />);
    await screen.findByRole('heading', { name: 'Notebook' });
    expect(document.activeElement).toBe(document.body);
    expect(document.title).toBe('Notebook · Anti-alias filter · Rolloff');

    await userEvent.click(screen.getByRole('link', { name: 'Versions' }));
    const heading = await screen.findByRole('heading', { name: 'Versions' });
    await expect.poll(() => document.activeElement).toBe(heading);
    expect(heading.getAttribute('tabindex')).toBe('-1');
    expect(document.title).toBe('Versions · Anti-alias filter · Rolloff');
  });
});
