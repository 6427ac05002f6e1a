import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, openBrowser, screenshot } from './browser';
import type { Session } from './browser';
import { cellAt, circuitText, createNotebook, setCircuitText, signIn, waitSaved } from './helpers';

// A demo user (packages/api/src/seed/demo-users.ts), signed in from two browsers.
const designer = 'priya.venkat';

describe('working with cells', () => {
  let first: Session;
  let second: Session;
  let notebookId = '';

  beforeAll(async () => {
    first = await openBrowser();
    second = await openBrowser();
  });
  afterAll(async () => {
    await first?.close();
    await second?.close();
  });

  it('adds a note cell, writes Markdown in place, moves it and deletes it with undo', async () => {
    const { page } = first;
    await signIn(page, designer);
    notebookId = await createNotebook(page, `Loop notes ${Date.now()}`, { starter: true });
    await page.getByRole('button', { name: 'Add a note cell at position 2' }).click();
    const note = cellAt(page, 1);
    await note.and(page.locator('[data-kind="note"]')).waitFor();
    await note.getByRole('textbox').fill('# Loop goals\n\nCrossover above **20 kHz**.');
    await note.getByRole('button', { name: 'Done' }).click();
    await note.getByRole('heading', { name: 'Loop goals' }).waitFor();
    await waitSaved(page, 1);

    await page.getByRole('button', { name: 'Move Note 2 up' }).click();
    await cellAt(page, 0).and(page.locator('[data-kind="note"]')).waitFor();
    await page.getByRole('button', { name: 'Delete Note 1' }).click();
    await page.getByRole('button', { name: 'Undo' }).waitFor();
    await expect.poll(() => page.locator('[data-kind="note"]').count(), { timeout: 15_000 }).toBe(0);
    await page.getByRole('button', { name: 'Undo' }).click();
    await cellAt(page, 0).getByRole('heading', { name: 'Loop goals' }).waitFor();
    await screenshot(page, 'cells-note-moved-restored');
  });

  it('moves on from a circuit cell to the next cell with Shift-Enter', async () => {
    const { page } = first;
    await page.getByRole('button', { name: 'Add a note cell at position 3' }).click();
    await cellAt(page, 2).and(page.locator('[data-kind="note"]')).waitFor();
    await page.keyboard.press('Escape');
    await cellAt(page, 1).locator('.cm-content').click();
    await page.keyboard.press('Shift+Enter');
    expect(await cellAt(page, 2).evaluate((cell) => cell.contains(document.activeElement))).toBe(true);
  });

  it('makes a labelled version and opens it read-only', async () => {
    const { page } = first;
    await page.getByRole('link', { name: 'Versions' }).click();
    await page.getByLabel('Make a version of every cell as it is now').fill('Ready for review');
    await page.getByRole('button', { name: 'Make version' }).click();
    const entry = page.getByTestId('versions').getByRole('link', { name: /Ready for review/ });
    await entry.waitFor();
    await entry.click();
    await page.getByRole('heading', { level: 1, name: /Ready for review/ }).waitFor();
    const editor = page.getByTestId('version-cells').locator('.cm-content').first();
    await editor.waitFor();
    expect(await editor.getAttribute('contenteditable')).toBe('false');
    await expect.poll(() => page.getByTestId('version-cells').getByRole('heading', { name: 'Loop goals' }).count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByRole('button', { name: 'Fork from this version' }).count(), { timeout: 15_000 }).toBe(1);
    await screenshot(page, 'version-read-only');
    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
  });

  it('shows a conflict side by side when another tab saved first, and keeps mine as a new revision', async () => {
    await signIn(second.page, designer);
    await second.page.goto(`${baseUrl}/notebooks/${notebookId}`);
    const circuit = 1;
    const start = await circuitText(second.page, circuit);

    const theirs = start.replace('let R = 1.6k', 'let R = 1.5k');
    await setCircuitText(first.page, circuit, theirs);
    const theirRevision = await waitSaved(first.page, circuit);

    const mine = start.replace('let C = 100n', 'let C = 110n');
    await setCircuitText(second.page, circuit, mine);
    const dialog = second.page.getByRole('dialog', { name: 'Someone else saved this cell first' });
    await dialog.waitFor({ timeout: 20_000 });
    expect(await dialog.getByTestId('conflict-theirs').textContent()).toContain('let R = 1.5k');
    expect(await dialog.getByTestId('conflict-mine').textContent()).toContain('let C = 110n');
    await screenshot(second.page, 'conflict-dialog');
    await dialog.getByRole('button', { name: 'Keep mine as a new revision' }).click();
    expect(await waitSaved(second.page, circuit)).toBe(theirRevision + 1);

    await first.page.reload();
    expect(await circuitText(first.page, circuit)).toBe(mine);
  });
});
