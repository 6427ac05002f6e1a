import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { baseUrl, openBrowser, screenshot } from './browser';
import type { Session } from './browser';
import { cellAt, circuitText, createNotebook, setCircuitText, signIn, waitSaved } from './helpers';

// A demo user (packages/api/src/seed/demo-users.ts).
const designer = 'tobias.okafor';

describe('a designer’s notebook, in the browser against the real server', () => {
  let session: Session;
  let notebookId = '';
  const brokenText = FIRST_EXAMPLE.replace('R2 [a b]        R', 'R2 [a b         R');

  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('signs in through the stand-in and creates a notebook', async () => {
    const { page } = session;
    await signIn(page, designer);
    await screenshot(page, 'notebooks-signed-in');
    notebookId = await createNotebook(page, `Sallen-Key try ${Date.now()}`, { starter: false });
    expect(notebookId).toMatch(/^[A-Za-z0-9_-]{12}$/);
    expect(await cellAt(page, 0).getAttribute('data-kind')).toBe('circuit');
  });

  it('solves the first example as it is typed: a corner near 1 kHz and every requirement passing', async () => {
    const { page } = session;
    await setCircuitText(page, 0, FIRST_EXAMPLE);
    const corner = cellAt(page, 0).locator('[data-readout="corner"] dd');
    await corner.waitFor({ timeout: 30_000 });
    // The example is designed for fc = 1 kHz (cell-language.md, "A first example").
    expect(Number(await corner.getAttribute('data-value'))).toBeGreaterThan(980);
    expect(Number(await corner.getAttribute('data-value'))).toBeLessThan(1020);
    expect(await corner.textContent()).toContain('kHz');
    const requirements = cellAt(page, 0).getByTestId('requirement');
    await expect.poll(() => requirements.count(), { timeout: 15_000 }).toBe(3);
    expect(await requirements.evaluateAll((items) => items.map((item) => item.getAttribute('data-pass')))).toEqual(['true', 'true', 'true']);
    await cellAt(page, 0).getByTestId('plot-bode').locator('.main-svg').first().waitFor({ timeout: 30_000 });
    expect(await waitSaved(page, 0)).toBeGreaterThanOrEqual(2);
    await screenshot(page, 'first-example-solved');
  });

  it('underlines a broken line and lists its diagnostic', async () => {
    const { page } = session;
    await setCircuitText(page, 0, brokenText);
    const diagnostic = cellAt(page, 0).locator('[data-testid="diagnostics"] li[data-line="8"]');
    await diagnostic.waitFor({ timeout: 20_000 });
    expect(await diagnostic.getAttribute('data-severity')).toBe('error');
    expect(((await diagnostic.textContent()) ?? '').length).toBeGreaterThan(10);
    await expect.poll(() => cellAt(page, 0).locator('.cm-lintRange-error').count(), { timeout: 15_000 }).toBeGreaterThan(0);
    await waitSaved(page, 0);
    await screenshot(page, 'broken-line-diagnostic');
  });

  it('finds the text saved after a reload', async () => {
    const { page } = session;
    await page.reload();
    await cellAt(page, 0).locator('.cm-content').waitFor();
    expect(await circuitText(page, 0)).toBe(brokenText);
    expect(await cellAt(page, 0).getByTestId('save-state').getAttribute('data-state')).toBe('saved');
  });

  it('restores an older revision from the history as a new revision', async () => {
    const { page } = session;
    const before = await waitSaved(page, 0);
    await cellAt(page, 0).getByRole('link', { name: 'History' }).click();
    await page.waitForURL(/\/history$/);
    const cellId = cellIdFromUrl(page.url());
    const rows = page.getByTestId('revisions').locator('tr[data-revision]');
    await rows.first().waitFor();
    // The newest revision holding the first example untouched is the one to go back to.
    const numbers = (await rows.evaluateAll((items) => items.map((item) => Number(item.getAttribute('data-revision'))))).filter((n) => n < before);
    let target = 0;
    for (const number of numbers) {
      const response = await page.request.get(`${baseUrl}/api/notebooks/${notebookId}/cells/${cellId}/revisions/${number}`);
      const revision = (await response.json()) as { text: string };
      if (revision.text === FIRST_EXAMPLE) {
        target = number;
        break;
      }
    }
    expect(target).toBeGreaterThan(0);
    await page.getByLabel(`Compare revision ${target} as A`).check();
    await page.getByTestId('text-diff').waitFor();
    expect(await page.getByTestId('text-diff').locator('[data-change="removed"]').allTextContents()).toEqual([expect.stringContaining('R2 [a b]')]);
    await page.getByTestId('plot-bode').locator('.main-svg').first().waitFor({ timeout: 30_000 });
    await screenshot(page, 'cell-history');
    await page.getByRole('button', { name: `Restore revision ${target}` }).click();
    await page.getByText(`Restored as revision ${before + 1}.`).waitFor();

    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
    await cellAt(page, 0).locator('.cm-content').waitFor();
    expect(await circuitText(page, 0)).toBe(FIRST_EXAMPLE);
    expect(await waitSaved(page, 0)).toBe(before + 1);
    await cellAt(page, 0).locator('[data-readout="corner"]').waitFor({ timeout: 30_000 });
    await screenshot(page, 'revision-restored');
  });
});

function cellIdFromUrl(url: string): number {
  return Number(/\/cells\/(\d+)\/history/.exec(url)?.[1]);
}
