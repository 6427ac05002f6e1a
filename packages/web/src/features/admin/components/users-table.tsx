import { SiteRoleSchema } from '@rolloff/api/contract';
import { Button } from '../../../components/ui/button';
import { ErrorMessage, Loading } from '../../../components/ui/status-message';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { useAdminUserList } from '../api/list-users';
import { useUpdateUser } from '../api/update-user';

/** The users of the site for an admin: site roles, disable and enable. */
export function UsersTable({ meId }: { meId: number }) {
  const users = useAdminUserList();
  const update = useUpdateUser();
  if (users.isPending) return <Loading text="Loading the users…" />;
  if (users.isError) return <ErrorMessage error={users.error} retry={() => void users.refetch()} />;
  return (
    <div className="space-y-3">
      {update.error ? <ErrorMessage error={update.error} /> : null}
      <div className="overflow-x-auto rounded-xl border border-rule bg-panel">
        <table className="w-full text-sm" data-testid="users">
          <thead className="bg-sunken text-left text-xs uppercase tracking-wide text-ink-faint">
            <tr>
              <th className="px-3 py-2 font-medium">Person</th>
              <th className="px-3 py-2 font-medium">E-mail</th>
              <th className="px-3 py-2 font-medium">Site role</th>
              <th className="px-3 py-2 font-medium">Last sign-in</th>
              <th className="px-3 py-2 font-medium">State</th>
            </tr>
          </thead>
          <tbody>
            {users.data.items.map((user) => (
              <tr key={user.id} className="border-t border-rule" data-login={user.login}>
                <td className="px-3 py-2">
                  <span className="font-medium">{user.name || user.login}</span>
                  <span className="text-ink-faint"> @{user.login}</span>
                </td>
                <td className="px-3 py-2 text-ink-soft">{user.email ?? '—'}</td>
                <td className="px-3 py-2">
                  <select
                    aria-label={`Site role of ${user.login}`}
                    value={user.siteRole}
                    disabled={update.isPending || user.id === meId}
                    onChange={(event) => update.mutate({ userId: user.id, body: { siteRole: SiteRoleSchema.parse(event.target.value) } })}
                    className="rounded-md border border-rule bg-panel px-2 py-1"
                  >
                    <option value="member">member</option>
                    <option value="admin">admin</option>
                  </select>
                </td>
                <td className="px-3 py-2 text-ink-soft" title={user.lastSignInAt ? exactTime(user.lastSignInAt) : undefined}>
                  {user.lastSignInAt ? timeAgo(user.lastSignInAt) : 'never'}
                </td>
                <td className="px-3 py-2">
                  {user.id === meId ? (
                    <span className="text-xs text-ink-faint">you</span>
                  ) : (
                    <Button
                      size="sm"
                      variant={user.disabled ? 'secondary' : 'danger'}
                      disabled={update.isPending}
                      onClick={() => update.mutate({ userId: user.id, body: { disabled: !user.disabled } })}
                    >
                      {user.disabled ? 'Enable' : 'Disable'}
                    </Button>
                  )}
                  {user.disabled ? <span className="ml-2 text-xs text-fail">disabled</span> : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-faint">Disabling someone ends their sessions at once; they cannot sign in until enabled again. Their notebooks stay.</p>
    </div>
  );
}
