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
    // An aborted request (the browser dropping a duplicate icon fetch, say) is not a failure.
    page.on('requestfailed', (request) => {
      if (request.failure()?.errorText !== 'net::ERR_ABORTED') failed.push(request.url());
    });
    // Every file of the app loads; API answers (a 401 from /api/me when signed out) are the page's business.
    page.on('response', (response) => {
      if (response.status() >= 400 && !response.url().startsWith(`${baseUrl}/api/`)) failed.push(`${response.status()} ${response.url()}`);
    });
    page.on('request', (request) => {
      const url = request.url();
      if (!url.startsWith(baseUrl) && !url.startsWith('data:')) elsewhere.push(url);
    });
    await page.goto(baseUrl);
    await page.getByTestId('health').and(page.locator('[data-state="ok"]')).waitFor({ timeout: 15_000 });
    expect(await page.title()).toBe('Filter design notebooks · Rolloff');
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
