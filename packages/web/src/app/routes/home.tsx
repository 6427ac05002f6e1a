import { HealthStatus } from '../../features/health/components/health-status';

/** The landing page. */
export function HomeRoute() {
  return (
    <section className="space-y-6">
      <h1 className="text-3xl font-semibold tracking-tight">Filter design notebooks for analog engineers</h1>
      <p className="max-w-2xl text-lg text-ink-soft">
        Write each candidate network as a short component list, see its Bode plot, corners and margins as you type,
        check it against written requirements, and have a colleague review and sign it off.
      </p>
      <HealthStatus />
    </section>
  );
}
