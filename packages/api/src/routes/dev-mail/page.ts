/** The development mailbox page: the stand-in's messages, newest first, every value escaped. */
import { escapeHtml } from '../../html.js';
import type { MailboxMessage } from './mailbox.js';

/** Escapes `text` and makes its http(s) addresses links (the only markup a message gets). */
function linkify(text: string): string {
  return text
    .split(/(https?:\/\/[^\s<>"']+)/)
    .map((part, index) => (index % 2 === 1 ? `<a href="${escapeHtml(part)}">${escapeHtml(part)}</a>` : escapeHtml(part)))
    .join('');
}

const style = `body{font-family:system-ui,sans-serif;max-width:52rem;margin:2rem auto;padding:0 1rem;line-height:1.5;color:#1f2933}
a{color:#1c5fa8}article{border-top:1px solid #cbd2d9;padding:1rem 0}h2{font-size:1.05rem;margin:0 0 .25rem}
dl{display:grid;grid-template-columns:max-content 1fr;gap:0 .75rem;margin:0 0 .5rem;color:#52606d;font-size:.9rem}dd{margin:0}
pre{white-space:pre-wrap;word-break:break-word;background:#f5f7fa;padding:.75rem;border-radius:4px;margin:0}`;

function shell(body: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Mailbox · Rolloff</title><style>${style}</style></head>
<body><h1>Mailbox</h1>
<p>What Rolloff sent to the local mail stand-in, newest first. Nothing here leaves this machine.</p>
${body}</body></html>`;
}

export function mailboxPage(messages: MailboxMessage[]): string {
  if (messages.length === 0) return shell('<p data-testid="mailbox-empty">No messages yet.</p>');
  const articles = messages.map(
    (message) => `<article data-testid="mail-message">
<h2>${escapeHtml(message.subject || '(no subject)')}</h2>
<dl><dt>To</dt><dd>${escapeHtml(message.to.join(', '))}</dd><dt>From</dt><dd>${escapeHtml(message.from)}</dd>
<dt>Received</dt><dd><time datetime="${escapeHtml(message.receivedAt)}">${escapeHtml(message.receivedAt)}</time></dd></dl>
<pre>${linkify(message.text)}</pre>
</article>`,
  );
  return shell(articles.join('\n'));
}

export function mailboxDownPage(standinUrl: string, reason: string): string {
  return shell(`<p data-testid="mailbox-down">The mail stand-in at ${escapeHtml(standinUrl)} does not answer (${escapeHtml(reason)}). Is it running?</p>`);
}
