import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, NavLink, Outlet, useLocation } from 'react-router-dom';
import { ProgressBar } from '../../components/ui/progress-bar';
import { ThemeSwitch } from '../../components/ui/theme-switch';
import { useFocusOnNavigation } from '../../hooks/use-focus-on-navigation';
import { meQueryOptions, useMe } from '../../features/auth/api/get-me';
import { SignInButton } from '../../features/auth/components/sign-in-button';
import { UserMenu } from '../../features/auth/components/user-menu';
import { onUnauthenticated } from '../../lib/api-client';
import { appPaths } from '../../lib/paths';

const navClass = ({ isActive }: { isActive: boolean }) => `text-sm ${isActive ? 'font-medium text-ink' : 'text-ink-soft hover:text-ink'}`;

/** The frame around every page: a quiet header, a notice when the session ends, and the page. */
export function RootLayout() {
  const me = useMe();
  const client = useQueryClient();
  const location = useLocation();
  const [sessionLost, setSessionLost] = useState(false);
  useFocusOnNavigation();
  useEffect(
    () =>
      onUnauthenticated(() => {
        setSessionLost(true);
        void client.invalidateQueries({ queryKey: meQueryOptions().queryKey });
      }),
    [client],
  );
  useEffect(() => {
    if (me.data) setSessionLost(false);
  }, [me.data]);

  return (
    <div className="min-h-screen bg-paper text-ink">
      <ProgressBar />
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-panel focus:px-3 focus:py-1">
        Skip to the page
      </a>
      <header className="border-b border-rule bg-panel">
        <div className="mx-auto flex max-w-[112rem] flex-wrap items-center justify-between gap-3 px-6 py-3">
          <div className="flex items-center gap-6">
            <Link to={me.data ? appPaths.notebooks() : appPaths.home()} className="flex items-center gap-2 text-lg font-semibold tracking-tight text-ink">
              <img src="/favicon.svg" alt="" className="h-6 w-6" />
              Rolloff
            </Link>
            {me.data ? (
              <nav aria-label="Main" className="flex gap-4">
                <NavLink to={appPaths.notebooks()} className={navClass} end>
                  Notebooks
                </NavLink>
                <NavLink to={appPaths.help()} className={navClass}>
                  Cell language
                </NavLink>
              </nav>
            ) : null}
          </div>
          <div className="flex items-center gap-4">
            {me.data ? (
              <UserMenu me={me.data} />
            ) : me.isSuccess && location.pathname !== appPaths.home() ? (
              <SignInButton size="sm" returnTo={location.pathname} />
            ) : null}
            <ThemeSwitch />
          </div>
        </div>
      </header>
      {sessionLost ? (
        <div role="alert" className="border-b border-warn bg-warn-soft">
          <p className="mx-auto flex max-w-[112rem] flex-wrap items-center gap-3 px-6 py-2 text-sm">
            Your session has ended. Unsaved text stays in this browser and is saved once you are back.
            <a href={appPaths.signIn(location.pathname)} target="_blank" rel="noreferrer" className="font-medium text-accent underline">
              Sign in again (opens a new tab)
            </a>
          </p>
        </div>
      ) : null}
      <main id="main" className="mx-auto max-w-[112rem] px-6 py-8">
        <Outlet />
      </main>
    </div>
  );
}
