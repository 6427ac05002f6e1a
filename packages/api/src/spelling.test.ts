import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

// Rolloff writes British English (DEVELOPERS.md, "Words"): what the API says in messages,
// e-mail and pages keeps to it. These are American forms a message could slip into; `analog`
// is the trade's spelling and stays, and identifiers (TypeORM's `initialize`, a page's CSS
// `color:`) are code, not words.
const american =
  /\b((?<!-)colors?(?!\s*:)|colored|centers?|centered|behaviors?|favors?|favorite|labeled|canceled|modeling|organiz\w*|recogniz\w*|summariz\w*|analyzed|catalog|gray)\b/i;

function sources(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const full = path.join(folder, name);
    if (statSync(full).isDirectory()) return sources(full);
    return name.endsWith('.ts') ? [full] : [];
  });
}

describe("the API's words", () => {
  it('are checked by a pattern that finds American forms and passes British ones and CSS', () => {
    for (const text of ['the colors of the plot', 'a labeled trace', 'summarized', 'centered']) expect(american.test(text), text).toBe(true);
    for (const text of ['the colours of the plot', 'a labelled trace', 'summarised', 'centred', 'body{color:#1f2933}', 'border-color: #fff'])
      expect(american.test(text), text).toBe(false);
  });

  it('keep to British spelling', () => {
    const here = fileURLToPath(import.meta.url);
    const src = path.dirname(here);
    const found = sources(src)
      .filter((file) => file !== here)
      .flatMap((file) =>
        readFileSync(file, 'utf8')
          .split('\n')
          .flatMap((line, index) => (american.test(line) ? [`${path.relative(src, file)}:${index + 1}: ${line.trim()}`] : [])),
      );
    expect(found).toEqual([]);
  });
});
