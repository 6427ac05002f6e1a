/** The caution shown beside a cell whose drive or parts suggest mains or hazardous voltage. */
export function HazardCaution({ reasons }: { reasons: readonly string[] }) {
  if (reasons.length === 0) return null;
  return (
    <aside role="note" data-testid="hazard-caution" className="rounded-lg border border-warn bg-warn-soft p-3 text-sm text-ink">
      <p className="font-semibold text-warn">Caution: hazardous voltage</p>
      <p className="mt-1">
        This cell looks like a circuit at mains or another dangerous voltage ({reasons.join('; ')}). Such circuits can give a lethal shock,
        and capacitors can hold their charge after the supply is removed. Use safety-rated X and Y capacitors where a part sits across or
        to the line, give every stored charge a discharge path, and follow your local electrical codes and licensed practice. Rolloff's
        results do not replace them.
      </p>
    </aside>
  );
}

/** The reminder that results come from small-signal linear models. */
export function SmallSignalNote() {
  return (
    <p className="text-xs text-ink-faint">
      Results are small-signal linear models: no clipping, slew limits, saturation, heating or breakdown. Check the real circuit before
      trusting it with more.
    </p>
  );
}
