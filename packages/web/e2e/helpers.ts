/**
 * Steps the end-to-end flows share: signing in through the stand-in, making a notebook, and
 * reading and writing a circuit cell the way a person does, through the page.
 */
import type { Page } from 'playwright-core';
import { baseUrl } from './browser';

/** Signs in as a demo user through the OAuth stand-in (`?login=` skips its form). */
export async function signIn(page: Page, login: string): Promise<void> {
  await page.goto(`${baseUrl}/auth/github?login=${encodeURIComponent(login)}`);
  await page.waitForURL(/\/notebooks/, { timeout: 20_000 });
  await page
    .getByTestId('signed-in-as')
    .and(page.locator(`[data-login="${login}"]`))
    .waitFor();
}

/** Makes a notebook from the notebooks page and waits for it to open; returns its id. */
export async function createNotebook(page: Page, title: string, { starter }: { starter: boolean }): Promise<string> {
  await page.goto(`${baseUrl}/notebooks`);
  await page.getByRole('button', { name: 'New notebook' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'New notebook' });
  await dialog.getByLabel('Title').fill(title);
  const box = dialog.getByRole('checkbox');
  if ((await box.isChecked()) !== starter) await box.click();
  await dialog.getByRole('button', { name: 'Create notebook' }).click();
  await page.waitForURL(/\/notebooks\/[A-Za-z0-9_-]{12}$/);
  await page.getByRole('heading', { level: 1, name: title }).waitFor();
  return new URL(page.url()).pathname.split('/').pop() as string;
}

/** The circuit cell at `index` (0-based among all cells) on a notebook page. */
export const cellAt = (page: Page, index: number) => page.locator(`[data-cell-index="${index}"]`);

/** Replaces the whole text of a circuit cell's editor, as a paste would. */
export async function setCircuitText(page: Page, index: number, text: string): Promise<void> {
  const editor = cellAt(page, index).locator('.cm-content');
  await editor.waitFor();
  await editor.click();
  await page.keyboard.press('ControlOrMeta+A');
  await page.keyboard.insertText(text);
}

/** The text in a circuit cell's editor, line by line. */
export async function circuitText(page: Page, index: number): Promise<string> {
  // The editor arrives in its own chunk: until then the cell shows a plain copy of its text.
  await cellAt(page, index).locator('.cm-content .cm-line').first().waitFor();
  const lines = await cellAt(page, index).locator('.cm-content .cm-line').allTextContents();
  return lines.join('\n');
}

/** Waits until a cell says it is saved, and returns the revision it names. */
export async function waitSaved(page: Page, index: number): Promise<number> {
  const state = cellAt(page, index).getByTestId('save-state');
  await state.and(page.locator('[data-state="saved"]')).waitFor({ timeout: 20_000 });
  const text = (await state.textContent()) ?? '';
  return Number(/revision (\d+)/.exec(text)?.[1]);
}

/** Sends a request from the page with its session and CSRF token, as the app would. */
export async function fetchFromPage(page: Page, path: string, init: { method: string; body?: unknown }): Promise<{ status: number; body: unknown }> {
  return page.evaluate(
    async ({ path, init }) => {
      const token = document.cookie
        .split(';')
        .map((part) => part.trim().split('='))
        .find(([name]) => name === 'rolloff_csrf')?.[1];
      const response = await fetch(path, {
        method: init.method,
        headers: { 'content-type': 'application/json', accept: 'application/json', 'x-csrf-token': token ?? '' },
        body: init.body === undefined ? undefined : JSON.stringify(init.body),
      });
      const text = await response.text();
      return { status: response.status, body: text ? JSON.parse(text) : null };
    },
    { path, init },
  );
}
