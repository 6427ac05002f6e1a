import { Link, Outlet } from 'react-router-dom';
import { ThemeSwitch } from '../../components/ui/theme-switch';

/** The frame around every page: a quiet header and the page below it. */
export function RootLayout() {
  return (
    <div className="min-h-screen bg-paper text-ink">
      <header className="border-b border-rule bg-panel">
        <div className="mx-auto flex max-w-6xl items-center justify-between px-6 py-3">
          <Link to="/" className="flex items-center gap-2 text-lg font-semibold tracking-tight text-ink">
            <img src="/favicon.svg" alt="" className="h-6 w-6" />
            Rolloff
          </Link>
          <ThemeSwitch />
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-6 py-10">
        <Outlet />
      </main>
    </div>
  );
}
