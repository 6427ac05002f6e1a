import Markdown from 'react-markdown';

/**
 * A note cell's Markdown, rendered safely: raw HTML is dropped (never rendered), and
 * react-markdown's URL check keeps `javascript:` and other unsafe links out.
 */
export function MarkdownView({ text }: { text: string }) {
  return (
    <div className="rolloff-prose">
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
