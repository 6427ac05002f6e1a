import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, openBrowser, screenshot } from './browser';
import type { Session } from './browser';
import { cellAt, circuitText, createNotebook, fetchFromPage, setCircuitText, signIn, waitSaved } from './helpers';

// Demo users (packages/api/src/seed/demo-users.ts): an owner and a colleague.
const owner = 'ines.carvalho';
const colleague = 'kenji.arai';

describe('sharing with a viewer, who forks the notebook', () => {
  let ownerSession: Session;
  let colleagueSession: Session;
  let notebookId = '';
  let originalText = '';

  beforeAll(async () => {
    ownerSession = await openBrowser();
    colleagueSession = await openBrowser();
  });
  afterAll(async () => {
    await ownerSession?.close();
    await colleagueSession?.close();
  });

  it('the owner shares a notebook with a colleague as viewer', async () => {
    const { page } = ownerSession;
    await signIn(page, owner);
    notebookId = await createNotebook(page, `Anti-alias, shared ${Date.now()}`, { starter: true });
    originalText = await circuitText(page, 0);
    expect(originalText).toContain('require out corner');
    await page.getByTestId('share').click();
    const dialog = page.getByRole('dialog', { name: 'Share this notebook' });
    await dialog.getByLabel('Add someone by login').fill(colleague);
    await dialog.getByRole('button', { name: new RegExp(colleague.replace('.', '\\.')) }).click();
    await dialog.getByLabel('Role for the new member').selectOption('viewer');
    await dialog.getByRole('button', { name: 'Add' }).click();
    await dialog.locator(`[data-testid="members"] li[data-login="${colleague}"]`).waitFor();
    expect(await dialog.getByLabel(`Role of ${colleague}`).inputValue()).toBe('viewer');
    await screenshot(page, 'share-dialog');
    await dialog.getByRole('button', { name: 'Close' }).click();
  });

  it('the viewer sees no edit controls and cannot save through the API', async () => {
    const { page } = colleagueSession;
    await signIn(page, colleague);
    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
    await cellAt(page, 0).locator('.cm-content').waitFor();
    expect(await page.getByTestId('my-role').textContent()).toContain('viewer');
    expect(await cellAt(page, 0).locator('.cm-content').getAttribute('contenteditable')).toBe('false');
    for (const name of ['+ Circuit cell', '+ Note cell', 'Delete', 'Share']) expect(await page.getByRole('button', { name, exact: true }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Move / }).count()).toBe(0);
    expect(await page.getByTestId('read-only-note').isVisible()).toBe(true);

    const notebook = (await fetchFromPage(page, `/api/notebooks/${notebookId}`, { method: 'GET' })).body as { cells: { id: number; revision: number }[] };
    const cell = notebook.cells[0];
    const attempt = await fetchFromPage(page, `/api/notebooks/${notebookId}/cells/${cell.id}`, {
      method: 'PUT',
      body: { text: 'drive in\nshow in', baseRevision: cell.revision },
    });
    expect(attempt.status).toBe(403);
    expect(await circuitText(page, 0)).toBe(originalText);
    await screenshot(page, 'viewer-read-only');
  });

  it('the viewer forks it and edits the fork without touching the original', async () => {
    const { page } = colleagueSession;
    await page.getByTestId('fork').click();
    await page.waitForURL((url) => url.pathname.startsWith('/notebooks/') && !url.pathname.endsWith(notebookId));
    const forkId = new URL(page.url()).pathname.split('/').pop();
    const origin = page.getByTestId('forked-from');
    await origin.waitFor();
    expect(await origin.getByRole('link').getAttribute('href')).toBe(`/notebooks/${notebookId}`);
    expect(await page.getByTestId('my-role').textContent()).toContain('owner');

    const changed = originalText.replace('let R = 1.6k', 'let R = 3.3k');
    expect(changed).not.toBe(originalText);
    await setCircuitText(page, 0, changed);
    await waitSaved(page, 0);
    await page.reload();
    await cellAt(page, 0).locator('.cm-content').waitFor();
    expect(await circuitText(page, 0)).toBe(changed);
    await screenshot(page, 'fork-edited');

    // The original is as it was, and now counts its fork; the owner sees it once it is shared.
    const original = ownerSession.page;
    await original.reload();
    expect(await circuitText(original, 0)).toBe(originalText);
    await original.getByTestId('fork-count').and(original.locator('[data-count="1"]')).waitFor();
    expect(await original.getByTestId('private-forks').textContent()).toContain('One fork');

    await page.getByTestId('share').click();
    await page
      .getByRole('dialog', { name: 'Share this notebook' })
      .getByRole('checkbox', { name: /Link sharing/ })
      .click();
    await page.getByRole('dialog', { name: 'Share this notebook' }).getByLabel('Link to this notebook').waitFor();
    await original.reload();
    const link = original.getByTestId('forks').getByRole('link').first();
    await link.waitFor();
    expect(await link.getAttribute('href')).toBe(`/notebooks/${forkId}`);
    await screenshot(original, 'original-lists-fork');
  });
});
