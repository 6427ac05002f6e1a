import { Children, createElement, isValidElement } from 'react';
import type { ReactNode } from 'react';
import Markdown from 'react-markdown';
import type { Components } from 'react-markdown';

/** The text of a heading's children, for its anchor. */
function textOf(node: ReactNode): string {
  return Children.toArray(node)
    .map((child) =>
      typeof child === 'string' || typeof child === 'number'
        ? String(child)
        : isValidElement<{ children?: ReactNode }>(child)
          ? textOf(child.props.children)
          : '',
    )
    .join('');
}

/** An anchor for a heading: "drive — the stimulus" → "drive-the-stimulus". */
export function headingAnchor(text: string): string {
  return text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');
}

/**
 * Headings of written Markdown, moved down under the page's own: a `#` heading becomes an
 * element of level `topLevel`, `##` the next, and so on (at most h6), so a note's "# Goals"
 * never competes with the page's one H1. Each keeps its written size and gets an anchor.
 */
export function demotedHeadings(topLevel: number): Components {
  const entries = [1, 2, 3, 4, 5, 6].map((written) => {
    const tag = `h${Math.min(6, topLevel + written - 1)}`;
    const Heading = ({ children }: { children?: ReactNode }) =>
      createElement(tag, { id: headingAnchor(textOf(children)) || undefined, className: `md-h${written}` }, children);
    return [`h${written}`, Heading] as const;
  });
  return Object.fromEntries(entries) as Components;
}

const link: Components['a'] = ({ href, children }) => (
  <a href={href} target="_blank" rel="noreferrer noopener">
    {children}
  </a>
);

/** A code block that scrolls sideways can be reached and scrolled with the keyboard (WCAG 2.1.1). */
export const codeBlock: Components['pre'] = ({ children }) => <pre tabIndex={0}>{children}</pre>;

/**
 * Markdown people wrote (note cells, pin comments, review messages and summaries), rendered
 * safely: raw HTML is dropped (never rendered), and react-markdown's URL check keeps
 * `javascript:` and other unsafe links out. `compact` tightens it for comments in a thread.
 * Its headings start at `topLevel` (h3: under a cell's or a section's h2).
 */
export function MarkdownView({ text, compact = false, topLevel = 3 }: { text: string; compact?: boolean; topLevel?: number }) {
  return (
    <div className={compact ? 'rolloff-prose rolloff-prose-compact' : 'rolloff-prose'}>
      <Markdown skipHtml components={{ ...demotedHeadings(topLevel), a: link, pre: codeBlock }}>
        {text}
      </Markdown>
    </div>
  );
}
