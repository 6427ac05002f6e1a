/** Times as people read them: "3 min ago", with the exact time for a tooltip. */

const relative = new Intl.RelativeTimeFormat('en', { numeric: 'auto' });
const exact = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });

const STEPS: ReadonlyArray<[Intl.RelativeTimeFormatUnit, number]> = [
  ['second', 60],
  ['minute', 60],
  ['hour', 24],
  ['day', 7],
  ['week', 4.35],
  ['month', 12],
  ['year', Infinity],
];

/** "just now", "5 minutes ago", "yesterday", "3 months ago". */
export function timeAgo(iso: string, now = Date.now()): string {
  let amount = (new Date(iso).getTime() - now) / 1000;
  if (Math.abs(amount) < 30) return 'just now';
  for (const [unit, size] of STEPS) {
    if (Math.abs(amount) < size) return relative.format(Math.round(amount), unit);
    amount /= size;
  }
  return exact.format(new Date(iso));
}

/** The exact local time, e.g. "Dec 2, 2026, 10:15 AM". */
export function exactTime(iso: string): string {
  return exact.format(new Date(iso));
}
