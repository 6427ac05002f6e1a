import Markdown from 'react-markdown';

/**
 * Markdown people wrote (note cells, pin comments, review messages and summaries), rendered
 * safely: raw HTML is dropped (never rendered), and react-markdown's URL check keeps
 * `javascript:` and other unsafe links out. `compact` tightens it for comments in a thread.
 */
export function MarkdownView({ text, compact = false }: { text: string; compact?: boolean }) {
  return (
    <div className={compact ? 'rolloff-prose rolloff-prose-compact' : 'rolloff-prose'}>
      <Markdown
        skipHtml
        components={{
          a: ({ href, children }) => (
            <a href={href} target="_blank" rel="noreferrer noopener">
              {children}
            </a>
          ),
        }}
      >
        {text}
      </Markdown>
    </div>
  );
}
