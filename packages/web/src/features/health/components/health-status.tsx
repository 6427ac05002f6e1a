import { useHealth } from '../api/get-health';

/** A small badge saying whether the server and its database answer. */
export function HealthStatus() {
  const { data, isPending, isError } = useHealth();
  const state = isPending ? 'checking' : isError ? 'unreachable' : data.db === 'up' ? 'ok' : 'database down';
  const tone = state === 'ok' ? 'bg-pass-soft text-pass' : state === 'checking' ? 'bg-sunken text-ink-soft' : 'bg-fail-soft text-fail';
  return (
    <span data-testid="health" data-state={state} className={`inline-flex items-center gap-2 rounded-full px-3 py-1 text-sm ${tone}`}>
      <span aria-hidden className="h-2 w-2 rounded-full bg-current" />
      Server {state}
      {data ? <span className="text-ink-faint">v{data.version}</span> : null}
    </span>
  );
}
