import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { baseUrl, openBrowser } from './browser';
import type { Session } from './browser';
import { cellAt, fetchFromPage, signIn, waitSaved } from './helpers';

// A demo user (packages/api/src/seed/demo-users.ts).
const designer = 'priya.venkat';

// Lines that end in a number with an SI prefix or a unit: once, Enter after them accepted an
// offered word (`10n` became `10noise…`, `1m` became `1max`) and joined the next line.
const PREFIXED_VALUES = [
  '# RC-LC low-pass, values typed as a designer types them',
  'drive in',
  'R1 [in a] 4k7',
  'L1 [a b] 1m',
  'C1 [b gnd] 10n',
  'C2 [b out] 2.2u',
  'R2 [out gnd] 1M',
  'show out',
  'sweep 10 .. 1M',
  'require out gain >= -1 dB over 10 .. 1k',
].join('\n');

/** Types `text` into the empty circuit cell at `index` one key at a time, Enter at each line end. */
async function typeCell(session: Session, index: number, text: string): Promise<void> {
  const { page } = session;
  const editor = cellAt(page, index).locator('.cm-content');
  await editor.waitFor();
  await editor.click();
  const lines = text.split('\n');
  for (const [n, line] of lines.entries()) {
    await page.keyboard.type(line);
    if (n === lines.length - 1) break;
    // A person's pause before Enter: long enough for the completion list to open.
    await page.waitForTimeout(300);
    await page.keyboard.press('Enter');
  }
}

describe('typing a cell key by key', () => {
  let session: Session;

  beforeAll(async () => {
    session = await openBrowser();
    await signIn(session.page, designer);
  });
  afterAll(async () => {
    await session?.close();
  });

  for (const [name, text] of [
    ['values with SI prefixes at line ends', PREFIXED_VALUES],
    ['the language reference’s first example', FIRST_EXAMPLE.trimEnd()],
  ] as const) {
    it(`saves exactly what was typed: ${name}`, async () => {
      const { page } = session;
      const made = await fetchFromPage(page, '/api/notebooks', {
        method: 'POST',
        body: { title: `Typed by hand ${Date.now()}`, cells: [{ kind: 'circuit', text: '' }] },
      });
      expect(made.status).toBe(201);
      const notebookId = (made.body as { id: string }).id;
      await page.goto(`${baseUrl}/notebooks/${notebookId}`);

      await typeCell(session, 0, text);
      await waitSaved(page, 0);
      // Autosave may have stored an earlier part of the text: wait for the last save.
      const savedText = async () =>
        ((await fetchFromPage(page, `/api/notebooks/${notebookId}`, { method: 'GET' })).body as { cells: { text: string }[] }).cells[0].text;
      await expect.poll(savedText, { timeout: 20_000 }).toBe(text);
      expect(await cellAt(page, 0).locator('.cm-content .cm-line').count()).toBe(text.split('\n').length);
    }, 120_000);
  }
});
