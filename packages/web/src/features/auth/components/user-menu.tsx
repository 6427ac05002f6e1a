import type { Me } from '@rolloff/api/contract';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { RoleBadge } from '../../../components/ui/role-badge';
import { appPaths } from '../../../lib/paths';
import { useSignOut } from '../api/sign-out';

/** The signed-in person in the header: name, site role, settings and admin links, sign out. */
export function UserMenu({ me }: { me: Me }) {
  const signOut = useSignOut();
  return (
    <div className="flex items-center gap-3 text-sm">
      {me.siteRole === 'admin' ? (
        <Link to={appPaths.admin()} className="text-ink-soft hover:text-ink">
          Admin
        </Link>
      ) : null}
      <Link to={appPaths.settings()} className="text-ink-soft hover:text-ink">
        Settings
      </Link>
      <span className="flex items-center gap-2" data-testid="signed-in-as" data-login={me.login}>
        <span className="whitespace-nowrap font-medium">{me.name || me.login}</span>
        {me.siteRole === 'admin' ? <RoleBadge role="admin" /> : null}
      </span>
      <Button
        className="whitespace-nowrap"
        variant="quiet"
        size="sm"
        disabled={signOut.isPending}
        onClick={() =>
          signOut.mutate(undefined, {
            onSuccess: () => window.location.assign(appPaths.home()),
          })
        }
      >
        Sign out
      </Button>
    </div>
  );
}
