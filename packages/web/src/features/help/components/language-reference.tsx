/**
 * The cell language reference: the solver's LANGUAGE.md, rendered like a note (no raw HTML).
 * The file is read at build time; until the solver ships it, the page says so.
 */
import Markdown from 'react-markdown';

const files = import.meta.glob<string>('../../../../../solver/LANGUAGE.md', { query: '?raw', import: 'default', eager: true });
const reference: string | undefined = Object.values(files)[0];

/** The rendered language reference. */
export function LanguageReference() {
  if (!reference) {
    return <p className="text-ink-soft">The language reference has not been written yet. Until then, the editor's hints and completion show what each line can say.</p>;
  }
  return (
    <article className="rolloff-prose max-w-3xl" data-testid="language-reference">
      <Markdown skipHtml>{reference}</Markdown>
    </article>
  );
}
