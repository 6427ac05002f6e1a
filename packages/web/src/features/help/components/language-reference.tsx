/**
 * The cell language reference: the solver's LANGUAGE.md, rendered like a note (no raw HTML),
 * under the page's own heading, with a table of contents of its sections. The file is read at
 * build time; until the solver ships it, the page says so.
 */
import Markdown from 'react-markdown';
import { codeBlock, demotedHeadings, headingAnchor } from '../../../components/ui/markdown-view';

const files = import.meta.glob<string>('../../../../../solver/LANGUAGE.md', { query: '?raw', import: 'default', eager: true });
const reference: string | undefined = Object.values(files)[0];

/** The reference's sections (its `##` headings), for the table of contents. */
export function sectionsOf(markdown: string): { title: string; anchor: string }[] {
  return [...markdown.matchAll(/^##\s+(.+?)\s*$/gm)].map((m) => {
    const title = m[1].replace(/`/g, '');
    return { title, anchor: headingAnchor(title) };
  });
}

// The page's H1 names the reference, so the file's own headings start at h2.
const components = { ...demotedHeadings(2), pre: codeBlock };

/** The rendered language reference. */
export function LanguageReference() {
  if (!reference) {
    return (
      <p className="text-ink-soft">
        The language reference has not been written yet. Until then, the editor's hints and completion show what each line can say.
      </p>
    );
  }
  return (
    <div className="flex flex-col gap-6 lg:flex-row-reverse lg:items-start lg:justify-end">
      <nav aria-label="Contents" className="rounded-lg border border-rule bg-panel p-4 text-sm lg:sticky lg:top-4 lg:w-64">
        <p className="mb-2 font-medium">Contents</p>
        <ol className="space-y-1">
          {sectionsOf(reference).map((section) => (
            <li key={section.anchor}>
              <a href={`#${section.anchor}`} className="text-accent">
                {section.title}
              </a>
            </li>
          ))}
        </ol>
      </nav>
      <article className="rolloff-prose max-w-3xl" data-testid="language-reference">
        <Markdown skipHtml components={components}>
          {reference}
        </Markdown>
      </article>
    </div>
  );
}
