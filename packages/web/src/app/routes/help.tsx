import { SmallSignalNote } from '../../features/circuit/components/hazard-caution';
import { LanguageReference } from '../../features/help/components/language-reference';
import { useDocumentTitle } from '../../hooks/use-document-title';

/** The cell language reference, with what results mean and where they stop. */
export function Component() {
  useDocumentTitle('The cell language');
  return (
    <section className="space-y-6">
      <div className="max-w-3xl space-y-3">
        <h1 className="text-2xl font-semibold tracking-tight">The cell language</h1>
        <div className="rounded-lg border border-rule bg-panel p-4 text-sm text-ink-soft">
          <p className="font-medium text-ink">What the results are</p>
          <p className="mt-1">
            Rolloff solves each cell as a small-signal linear model by complex nodal analysis: every part is an ideal linear element at each frequency of the
            sweep. Real parts clip, slew, saturate, heat up and break down; check a design on the bench before trusting it with more than the model covers.
          </p>
          <p className="mt-2">
            A cell that suggests mains or another hazardous voltage shows a caution beside its plot. Such circuits need safety-rated parts, discharge paths for
            stored energy, and the local electrical codes and licensed practice, which Rolloff does not replace.
          </p>
          <div className="mt-2">
            <SmallSignalNote />
          </div>
        </div>
      </div>
      <LanguageReference />
    </section>
  );
}
