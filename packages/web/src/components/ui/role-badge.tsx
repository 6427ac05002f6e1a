const TONES: Record<string, string> = {
  owner: 'bg-accent text-accent-ink',
  editor: 'bg-accent-soft text-accent',
  reviewer: 'bg-warn-soft text-warn',
  viewer: 'bg-sunken text-ink-soft',
  admin: 'bg-sand text-sand-ink',
  member: 'bg-sunken text-ink-soft',
};

/** A person's role (notebook or site) as a small badge. */
export function RoleBadge({ role }: { role: string }) {
  return <span className={`inline-flex rounded-full px-2 py-0.5 text-xs font-medium ${TONES[role] ?? 'bg-sunken text-ink-soft'}`}>{role}</span>;
}
