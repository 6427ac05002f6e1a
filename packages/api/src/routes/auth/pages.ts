/** The few plain pages sign-in shows itself, when it cannot hand over to the web app. */
import { escapeHtml } from '../../html.js';

/** A small page with a title, a sentence and a link onwards. */
export function messagePage(title: string, message: string, link: { href: string; text: string }): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · Rolloff</title>
<style>body{font-family:system-ui,sans-serif;max-width:36rem;margin:4rem auto;padding:0 1rem;line-height:1.5;color:#1f2933}a{color:#1c5fa8}</style>
</head><body><h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p><p><a href="${escapeHtml(link.href)}">${escapeHtml(link.text)}</a></p></body></html>`;
}
