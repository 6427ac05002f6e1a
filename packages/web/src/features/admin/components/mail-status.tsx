import { ErrorMessage, Loading } from '../../../components/ui/status-message';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { useMailStatus } from '../api/get-mail-status';

/** Outgoing mail for an admin: whether the relay answers, and what waits, went out or failed. */
export function MailStatusPanel() {
  const status = useMailStatus();
  if (status.isPending) return <Loading text="Asking the mail relay…" />;
  if (status.isError) return <ErrorMessage error={status.error} retry={() => void status.refetch()} />;
  const { relay, queued, oldestQueuedAt, sentLastDay, failedLastDay, lastFailure } = status.data;
  return (
    <div className="space-y-3 rounded-xl border border-rule bg-panel p-4 text-sm" data-testid="mail-status">
      <p>
        <span className="font-medium">Mail relay {relay.address}: </span>
        {relay.up ? (
          <span>answers.</span>
        ) : (
          <span>does not answer ({relay.error}). Rolloff keeps working; mail waits and goes out once the relay is back.</span>
        )}
      </p>
      <dl className="grid grid-cols-3 gap-3">
        <div>
          <dt className="text-xs uppercase tracking-wide text-ink-faint">Waiting</dt>
          <dd className="text-lg font-semibold">{queued}</dd>
          {oldestQueuedAt ? (
            <dd className="text-ink-soft" title={exactTime(oldestQueuedAt)}>
              oldest {timeAgo(oldestQueuedAt)}
            </dd>
          ) : null}
        </div>
        <div>
          <dt className="text-xs uppercase tracking-wide text-ink-faint">Sent, last 24 h</dt>
          <dd className="text-lg font-semibold">{sentLastDay}</dd>
        </div>
        <div>
          <dt className="text-xs uppercase tracking-wide text-ink-faint">Failed, last 24 h</dt>
          <dd className="text-lg font-semibold">{failedLastDay}</dd>
        </div>
      </dl>
      {lastFailure ? (
        <p className="text-ink-soft">
          Last failure, <span title={exactTime(lastFailure.at)}>{timeAgo(lastFailure.at)}</span>: “{lastFailure.subject}” — {lastFailure.error}
        </p>
      ) : null}
    </div>
  );
}
