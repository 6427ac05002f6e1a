import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, openBrowser, screenshot } from './browser';
import type { Session } from './browser';

describe('the home page served by the API', () => {
  let session: Session;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('renders and reads the server health as ok', async () => {
    const { page } = session;
    const failed: string[] = [];
    const elsewhere: string[] = [];
    page.on('requestfailed', (request) => failed.push(request.url()));
    page.on('request', (request) => {
      const url = request.url();
      if (!url.startsWith(baseUrl) && !url.startsWith('data:')) elsewhere.push(url);
    });
    await page.goto(baseUrl);
    await page.getByTestId('health').and(page.locator('[data-state="ok"]')).waitFor({ timeout: 15_000 });
    expect(await page.title()).toBe('Rolloff');
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain('Filter design notebooks');
    // Fonts are shipped with the app, and nothing is fetched from another host.
    const fonts = await page.evaluate(() => document.fonts.check('16px "Fira Sans"'));
    expect(fonts).toBe(true);
    expect(failed).toEqual([]);
    expect(elsewhere).toEqual([]);
    // The landing page's example is a real plot, solved in the browser.
    await page.getByTestId('plot-bode').locator('.main-svg').first().waitFor({ timeout: 30_000 });
    await screenshot(page, 'home');
  });
});
