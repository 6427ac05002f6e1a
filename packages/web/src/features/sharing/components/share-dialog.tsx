/**
 * Sharing a notebook: its members with their roles, adding someone by login, changing and
 * removing roles, and link sharing on or off. Only an owner (canShare) gets the controls;
 * anyone else sees who has access and nothing they cannot do.
 */
import type { MemberRole, UserRef, Visibility } from '@rolloff/api/contract';
import { MemberRoleSchema } from '@rolloff/api/contract';
import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { RoleBadge } from '../../../components/ui/role-badge';
import { ErrorMessage, Loading } from '../../../components/ui/status-message';
import { useMemberList } from '../api/list-members';
import { usePutMember } from '../api/put-member';
import { useRemoveMember } from '../api/remove-member';
import { useUserSearch } from '../api/search-users';

const ROLE_HELP: Record<MemberRole, string> = {
  editor: 'edits cells, makes versions',
  reviewer: 'reads, pins comments, signs off',
  viewer: 'reads and forks',
};

export interface ShareDialogProps {
  notebookId: string;
  open: boolean;
  onClose: () => void;
  canShare: boolean;
  visibility: Visibility;
  onVisibilityChange: (visibility: Visibility) => void;
  visibilityBusy?: boolean;
  /** The page's own address, to copy for link sharing. */
  link: string;
  /** The role offered first when adding someone (viewer unless the dialog was opened to add a reviewer). */
  initialRole?: MemberRole;
}

function RoleSelect({ value, onChange, label, disabled }: { value: MemberRole; onChange: (role: MemberRole) => void; label: string; disabled?: boolean }) {
  return (
    <select
      aria-label={label}
      value={value}
      disabled={disabled}
      onChange={(event) => onChange(MemberRoleSchema.parse(event.target.value))}
      className="rounded-md border border-rule bg-panel px-2 py-1 text-sm"
    >
      {MemberRoleSchema.options.map((role) => (
        <option key={role} value={role}>
          {role} — {ROLE_HELP[role]}
        </option>
      ))}
    </select>
  );
}

function AddMember({ notebookId, taken, initialRole }: { notebookId: string; taken: ReadonlySet<number>; initialRole: MemberRole }) {
  const [query, setQuery] = useState('');
  const [role, setRole] = useState<MemberRole>(initialRole);
  const [picked, setPicked] = useState<UserRef | null>(null);
  const search = useUserSearch(picked ? '' : query);
  const put = usePutMember(notebookId);
  const inputId = useId();
  const candidates = (search.data?.items ?? []).filter((u) => !taken.has(u.id));
  const exact = candidates.find((u) => u.login.toLowerCase() === query.trim().toLowerCase()) ?? null;
  const chosen = picked ?? exact;

  return (
    <form
      className="space-y-2"
      onSubmit={(event) => {
        event.preventDefault();
        if (!chosen) return;
        put.mutate(
          { userId: chosen.id, role },
          {
            onSuccess: () => {
              setQuery('');
              setPicked(null);
            },
          },
        );
      }}
    >
      <label htmlFor={inputId} className="block text-sm font-medium">
        Add someone by login
      </label>
      <div className="flex flex-wrap gap-2">
        <input
          id={inputId}
          value={picked ? picked.login : query}
          onChange={(event) => {
            setPicked(null);
            setQuery(event.target.value);
          }}
          placeholder="login"
          autoComplete="off"
          className="min-w-40 flex-1 rounded-md border border-rule bg-panel px-2 py-1 text-sm"
        />
        <RoleSelect value={role} onChange={setRole} label="Role for the new member" />
        <Button type="submit" variant="primary" disabled={!chosen || put.isPending}>
          Add
        </Button>
      </div>
      {!picked && query.trim() && candidates.length > 0 ? (
        <ul aria-label="People found" className="flex flex-wrap gap-1">
          {candidates.slice(0, 8).map((user) => (
            <li key={user.id}>
              <button type="button" onClick={() => setPicked(user)} className="rounded-full border border-rule px-2 py-0.5 text-xs hover:bg-sunken">
                {user.login}
                {user.name ? <span className="text-ink-faint"> · {user.name}</span> : null}
              </button>
            </li>
          ))}
        </ul>
      ) : null}
      {!picked && query.trim() && search.isSuccess && candidates.length === 0 ? (
        <p className="text-xs text-ink-faint">Nobody with a login starting “{query.trim()}” has signed in to Rolloff yet.</p>
      ) : null}
      {put.error ? <ErrorMessage error={put.error} /> : null}
    </form>
  );
}

/** The share dialog of a notebook. */
export function ShareDialog({
  notebookId,
  open,
  onClose,
  canShare,
  visibility,
  onVisibilityChange,
  visibilityBusy,
  link,
  initialRole = 'viewer',
}: ShareDialogProps) {
  const members = useMemberList(notebookId, open);
  const put = usePutMember(notebookId);
  const remove = useRemoveMember(notebookId);
  const [copied, setCopied] = useState(false);
  const items = members.data?.items ?? [];
  const taken = new Set(items.map((m) => m.user.id));

  return (
    <Dialog open={open} title="Share this notebook" onClose={onClose}>
      <div className="space-y-5">
        <section aria-label="Link sharing" className="space-y-2">
          {canShare ? (
            <label className="flex items-start gap-2 text-sm">
              <input
                type="checkbox"
                checked={visibility === 'link'}
                disabled={visibilityBusy}
                onChange={(event) => onVisibilityChange(event.target.checked ? 'link' : 'private')}
                className="mt-1"
              />
              <span>
                <span className="font-medium">Link sharing</span>
                <span className="block text-ink-soft">Anyone signed in who has the link can view and fork this notebook.</span>
              </span>
            </label>
          ) : (
            <p className="text-sm text-ink-soft">
              {visibility === 'link' ? 'Link sharing is on: anyone signed in with the link can view.' : 'Only the members below can open this notebook.'}
            </p>
          )}
          {visibility === 'link' ? (
            <div className="flex gap-2">
              <input
                readOnly
                value={link}
                aria-label="Link to this notebook"
                className="flex-1 rounded-md border border-rule bg-sunken px-2 py-1 font-mono text-xs"
              />
              <Button
                size="sm"
                onClick={() => {
                  void navigator.clipboard?.writeText(link).then(() => setCopied(true));
                }}
              >
                {copied ? 'Copied' : 'Copy link'}
              </Button>
            </div>
          ) : null}
        </section>

        <section aria-label="Members" className="space-y-2">
          <h3 className="text-sm font-medium">People with access</h3>
          {members.isPending ? <Loading text="Loading the members…" /> : null}
          {members.isError ? <ErrorMessage error={members.error} retry={() => void members.refetch()} /> : null}
          <ul className="divide-y divide-rule rounded-lg border border-rule" data-testid="members">
            {items.map((member) => (
              <li key={member.user.id} className="flex flex-wrap items-center gap-2 px-3 py-2 text-sm" data-login={member.user.login}>
                <span className="flex-1">
                  <span className="font-medium">{member.user.name || member.user.login}</span>
                  <span className="text-ink-faint"> @{member.user.login}</span>
                </span>
                {canShare && member.role !== 'owner' ? (
                  <>
                    <RoleSelect
                      value={MemberRoleSchema.parse(member.role)}
                      label={`Role of ${member.user.login}`}
                      disabled={put.isPending}
                      onChange={(role) => put.mutate({ userId: member.user.id, role })}
                    />
                    <Button
                      size="sm"
                      variant="danger"
                      disabled={remove.isPending}
                      onClick={() => remove.mutate(member.user.id)}
                      aria-label={`Remove ${member.user.login}`}
                    >
                      Remove
                    </Button>
                  </>
                ) : (
                  <RoleBadge role={member.role} />
                )}
              </li>
            ))}
          </ul>
          {put.error || remove.error ? <ErrorMessage error={put.error ?? remove.error} /> : null}
        </section>

        {canShare ? <AddMember notebookId={notebookId} taken={taken} initialRole={initialRole} /> : null}
      </div>
    </Dialog>
  );
}
