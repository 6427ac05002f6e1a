/**
 * Which e-mails the signed-in person gets: one switch per kind, saved as soon as it is
 * flipped (and put back if the server refuses).
 */
import type { MailKind } from '@rolloff/api/contract';
import { ErrorMessage, Loading } from '../../../components/ui/status-message';
import { useSettings } from '../api/get-settings';
import { useUpdateSettings } from '../api/update-settings';

const KINDS: { kind: MailKind; title: string; detail: string }[] = [
  { kind: 'reviewRequests', title: 'Review requests', detail: 'Someone asks you to review a version of a notebook.' },
  { kind: 'reviewDecisions', title: 'Review decisions', detail: 'A reviewer asks for changes or signs off a review you asked for, or of a notebook you edit.' },
  { kind: 'pinReplies', title: 'Replies on pins', detail: 'Someone replies in a pin thread you are in.' },
  { kind: 'addedToNotebook', title: 'Added to a notebook', detail: 'Someone gives you a role in a notebook.' },
];

/** The e-mail switches. */
export function MailSettingsForm() {
  const settings = useSettings();
  const update = useUpdateSettings();
  if (settings.isPending) return <Loading text="Loading your settings…" />;
  if (settings.isError) return <ErrorMessage error={settings.error} retry={() => void settings.refetch()} />;
  const mail = settings.data.mail;
  return (
    <fieldset className="space-y-3 rounded-xl border border-rule bg-panel p-4" data-testid="mail-settings">
      <legend className="px-1 text-sm font-semibold">E-mail me when</legend>
      {KINDS.map(({ kind, title, detail }) => (
        <label key={kind} className="flex items-start gap-3 text-sm">
          <input
            type="checkbox"
            className="mt-1"
            checked={mail[kind]}
            data-kind={kind}
            onChange={(event) => update.mutate({ mail: { [kind]: event.target.checked } })}
          />
          <span>
            <span className="block font-medium">{title}</span>
            <span className="block text-ink-soft">{detail}</span>
          </span>
        </label>
      ))}
      {update.error ? <ErrorMessage error={update.error} /> : null}
      <p role="status" className="text-xs text-ink-faint">
        {update.isPending ? 'Saving…' : update.isSuccess ? 'Saved.' : 'Changes are saved as you make them.'}
      </p>
    </fieldset>
  );
}
