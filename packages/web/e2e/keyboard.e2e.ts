/**
 * The whole designer's path with the keyboard only — sign in, make a notebook, type a cell,
 * share it, ask for a review, pin a comment at a typed frequency, sign out — checking where
 * the focus lands after each step.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, openBrowser, screenshot } from './browser';
import type { Session } from './browser';
import { waitSaved } from './helpers';

// Demo people (packages/api/src/seed/demo-users.ts): a designer and the colleague who reviews.
const designer = { login: 'kenji.arai', name: 'Kenji Arai' };
const reviewer = { login: 'ines.carvalho', name: 'Inês Carvalho' };

const CELL = ['drive in', 'R1 [in out] 10k', 'C1 [out gnd] 10n', 'show out'];

/** What a screen reader would call the focused element: its label, its name, or its text. */
async function focused(page: Page): Promise<{ tag: string; name: string }> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { tag: 'body', name: '' };
    const labelled = el.getAttribute('aria-label') ?? (el as HTMLInputElement).labels?.[0]?.textContent ?? '';
    return { tag: el.tagName.toLowerCase(), name: (labelled || el.textContent || '').replace(/\s+/g, ' ').trim() };
  });
}

/** Presses Tab until the focused element's name matches, as a keyboard user would. */
async function tabTo(page: Page, name: RegExp, { back = false, most = 80 } = {}): Promise<void> {
  for (let i = 0; i < most; i += 1) {
    if (name.test((await focused(page)).name)) return;
    await page.keyboard.press(back ? 'Shift+Tab' : 'Tab');
  }
  throw new Error(`No element named ${name} within ${most} presses of Tab; focus is on ${JSON.stringify(await focused(page))}`);
}

describe('the designer’s path with the keyboard only', () => {
  let session: Session;
  const title = `Keyboard filter ${Date.now()}`;

  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('signs in: the skip link comes first, the stand-in is worked by keyboard, the notebooks page names itself', async () => {
    const { page } = session;
    await page.goto(baseUrl);
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.keyboard.press('Tab');
    expect((await focused(page)).name).toBe('Skip to the page');
    await tabTo(page, /^Sign in/);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/login\/oauth\/authorize|\/authorize/);
    await tabTo(page, new RegExp(`^${designer.name}`));
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/notebooks$/);
    await page.getByTestId('signed-in-as').waitFor();
    expect(await page.title()).toBe('Notebooks · Rolloff');
  });

  it('makes a notebook: the dialog’s title field takes the typing, then focus is on the new page’s heading', async () => {
    const { page } = session;
    await tabTo(page, /^New notebook$/);
    await page.keyboard.press('Enter');
    await page.getByRole('dialog', { name: 'New notebook' }).waitFor();
    expect(await focused(page)).toMatchObject({ tag: 'input', name: 'Title' });
    await page.keyboard.type(title);
    // An empty first cell, not the example.
    await page.keyboard.press('Tab');
    expect((await focused(page)).name).toMatch(/^Start with an example/);
    if (await page.getByRole('checkbox', { name: /Start with an example/ }).isChecked()) await page.keyboard.press('Space');
    await page.keyboard.press('Shift+Tab');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/notebooks\/[A-Za-z0-9_-]{12}$/);
    await expect.poll(() => focused(page), { timeout: 15_000 }).toEqual({ tag: 'h1', name: title });
    expect(await page.title()).toBe(`${title} · Rolloff`);
  });

  it('types a cell and it is saved', async () => {
    const { page } = session;
    await tabTo(page, /^Circuit 1, circuit text$/);
    for (const [n, line] of CELL.entries()) {
      await page.keyboard.type(line);
      if (n < CELL.length - 1) await page.keyboard.press('Enter');
    }
    await waitSaved(page, 0);
    expect((await focused(page)).name).toBe('Circuit 1, circuit text');
  });

  it('shares it with a reviewer, and focus comes back to Share when the dialog closes', async () => {
    const { page } = session;
    await tabTo(page, /^Share$/, { back: true });
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog', { name: 'Share' });
    await dialog.waitFor();
    await tabTo(page, /^Add someone by login$/);
    await page.keyboard.type(reviewer.login);
    await tabTo(page, new RegExp(reviewer.name));
    await page.keyboard.press('Enter');
    await tabTo(page, /^Role for the new member$/);
    await page.keyboard.press('r');
    expect(await dialog.getByLabel('Role for the new member').inputValue()).toBe('reviewer');
    await tabTo(page, /^Add$/);
    await page.keyboard.press('Enter');
    await dialog.getByLabel(`Role of ${reviewer.login}`).waitFor();
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'detached' });
    expect((await focused(page)).name).toBe('Share');
  });

  it('asks for a review: focus lands on the review page’s heading', async () => {
    const { page } = session;
    await tabTo(page, /^Ask for review$/);
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog', { name: 'Ask for a review' });
    await dialog.getByTestId('review-candidates').waitFor();
    expect(await page.evaluate(() => document.activeElement?.closest('dialog') !== null)).toBe(true);
    await tabTo(page, new RegExp(reviewer.name));
    await page.keyboard.press('Space');
    expect(await dialog.getByRole('checkbox', { name: new RegExp(reviewer.name) }).isChecked()).toBe(true);
    await tabTo(page, /^Ask for review$/);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/reviews\/\d+$/);
    await expect.poll(async () => (await focused(page)).tag, { timeout: 15_000 }).toBe('h1');
    expect(await page.title()).toMatch(/^Review · /);
  });

  it('pins a comment at a typed frequency and hears that it was made', async () => {
    const { page } = session;
    // The form appears under the plot once the cell is solved.
    await page.getByTestId('pin-composer').waitFor({ timeout: 30_000 });
    await tabTo(page, /^Frequency$/);
    await page.keyboard.type('1.6k');
    await tabTo(page, /^Comment$/);
    await page.keyboard.type('Is the corner where we want it?');
    await tabTo(page, /^Pin comment$/);
    await page.keyboard.press('Enter');
    const made = page.getByRole('status').filter({ hasText: 'Pinned at 1.6k.' });
    await made.waitFor({ timeout: 15_000 });
    await screenshot(page, 'keyboard-pinned');
  });

  it('signs out from the keyboard', async () => {
    const { page } = session;
    await page.keyboard.press('Home');
    await tabTo(page, /^Sign out$/, { back: true, most: 200 });
    await page.keyboard.press('Enter');
    await page.waitForURL(`${baseUrl}/`);
    await page.getByRole('heading', { level: 1 }).waitFor();
    expect(await page.getByTestId('signed-in-as').count()).toBe(0);
  });
});
