import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot } from './browser';
import type { Session } from './browser';
import { cellAt, fetchFromPage, setCircuitText, signIn, waitSaved } from './helpers';

// Demo users (packages/api/src/seed/demo-users.ts): Priya designs the regulator loop and
// asks Mara to review it.
const designer = { login: 'priya.venkat', email: 'priya.venkat@example.com' };
const reviewer = { login: 'mara.lindqvist', name: 'Mara Lindqvist', email: 'mara.lindqvist@example.com' };

/** The SMTP stand-in's mailbox that `npm test` runs beside the server. */
const mailbox = process.env.MAIL_STANDIN_URL ?? `http://127.0.0.1:${process.env.TEST_SMTP_STANDIN_HTTP_PORT ?? 4423}`;

/** The regulator loop with its first compensation: it crosses over far below 20 kHz. */
const FIRST_LOOP = `# Loop gain of the 3.3 V regulator, opened at the top of the feedback divider.
let gfs = 2

drive inj
R1  [inj fb]   100k   ±1%
R2  [fb gnd]   60k4   ±1%
U1  [gnd fb e] opamp gain 80dB gbw 1M
R3  [fb z]     10k
C1  [z e]      10n
C2  [fb e]     100p
A1  [out gnd gnd e] gm gfs
C3  [out gnd]  10u    esr 20m
R4  [out gnd]  3R3

show loop out / inj
sweep 10 .. 10M
require loop phase-margin >= 45 deg
require loop crossover >= 20k
`;
/** The same loop after the review: type II compensation moved up. */
const SECOND_LOOP = FIRST_LOOP.replace('R3  [fb z]     10k', 'R3  [fb z]     91k')
  .replace('C1  [z e]      10n', 'C1  [z e]      1n')
  .replace('C2  [fb e]     100p', 'C2  [fb e]     10p');

interface Message {
  to: string[];
  subject: string;
  text: string;
}

async function messagesAbout(title: string): Promise<Message[]> {
  const response = await fetch(`${mailbox}/messages`);
  const body = (await response.json()) as { messages: Message[] };
  return body.messages.filter((m) => m.subject.includes(title));
}

/** The newest message to `email` whose subject starts with `subject`, once it has arrived. */
async function mailTo(email: string, subject: string, title: string): Promise<Message> {
  const find = async () => (await messagesAbout(title)).find((m) => m.to.some((to) => to.includes(email)) && m.subject.startsWith(subject));
  await expect.poll(async () => (await find()) !== undefined, { timeout: 15_000 }).toBe(true);
  return (await find()) as Message;
}

/** A screenshot of the whole review view, from the top (the side panel keeps to the screen as one scrolls). */
async function reviewShot(page: Page, name: string): Promise<void> {
  await page.evaluate(() => window.scrollTo(0, 0));
  await screenshot(page, name);
}

/** The number in an annotation such as "phase margin 113.5° at 1.293 kHz". */
const marginIn = (text: string) => Number(/margin (-?[\d.]+)/.exec(text)?.[1]);

/** Waits for the review view's Bode plot and returns its phase-margin annotation and readout. */
async function phaseMarginOnPlot(page: Page): Promise<{ annotation: string; readout: number }> {
  const plot = page.getByTestId('review-cells').getByTestId('plot-bode').first();
  await plot.locator('.main-svg').first().waitFor({ timeout: 30_000 });
  const annotation = plot.locator('.annotation-text', { hasText: /^phase margin/ });
  await annotation.waitFor({ timeout: 15_000 });
  const readout = page.getByTestId('review-cells').locator('[data-readout="phase-margin"] dd').first();
  await readout.waitFor();
  return { annotation: (await annotation.textContent()) ?? '', readout: Number(await readout.getAttribute('data-value')) };
}

/** Clicks the loop trace of the magnitude panel at its sample nearest `frequency`. */
async function clickTraceNear(page: Page, frequency: number): Promise<void> {
  const plot = page.getByTestId('review-cells').getByTestId('plot-bode').first();
  const point = await plot.evaluate((element, target) => {
    // Plotly keeps the drawn data and the axes' scales on its element.
    const gd = element as unknown as {
      _fullData: { x: number[]; y: number[] }[];
      _fullLayout: { xaxis: { _offset: number; d2p: (v: number) => number }; yaxis: { _offset: number; d2p: (v: number) => number } };
    };
    const { x, y } = gd._fullData[0];
    let best = 0;
    for (let i = 1; i < x.length; i++) if (Math.abs(Math.log(x[i] / target)) < Math.abs(Math.log(x[best] / target))) best = i;
    const box = element.getBoundingClientRect();
    return {
      x: box.left + gd._fullLayout.xaxis._offset + gd._fullLayout.xaxis.d2p(x[best]),
      y: box.top + gd._fullLayout.yaxis._offset + gd._fullLayout.yaxis.d2p(y[best]),
    };
  }, frequency);
  await page.mouse.move(point.x, point.y);
  await page.mouse.click(point.x, point.y);
}

describe('a review: requested, pinned, needs changes, revised, signed off, and mailed', () => {
  let designerSession: Session;
  let reviewerSession: Session;
  const title = `Regulator loop for review ${Date.now()}`;
  let notebookId = '';

  beforeAll(async () => {
    designerSession = await openBrowser();
    reviewerSession = await openBrowser();
  });
  afterAll(async () => {
    await designerSession?.close();
    await reviewerSession?.close();
  });

  it('the designer asks a colleague to review a notebook with a loop trace', async () => {
    const { page } = designerSession;
    await signIn(page, designer.login);
    // The notebook and the reviewer's role are set up through the API, as other flows test those screens.
    const people = (await fetchFromPage(page, `/api/users?q=${reviewer.login}`, { method: 'GET' })).body as { items: { id: number; login: string }[] };
    const reviewerId = people.items.find((u) => u.login === reviewer.login)?.id;
    expect(reviewerId).toBeGreaterThan(0);
    const made = await fetchFromPage(page, '/api/notebooks', {
      method: 'POST',
      body: {
        title,
        cells: [
          { kind: 'note', text: '# 3.3 V regulator loop\n\nCrossover above **20 kHz**, at least 45° of phase margin.' },
          { kind: 'circuit', text: FIRST_LOOP },
        ],
      },
    });
    expect(made.status).toBe(201);
    notebookId = (made.body as { id: string }).id;
    expect((await fetchFromPage(page, `/api/notebooks/${notebookId}/members/${reviewerId}`, { method: 'PUT', body: { role: 'reviewer' } })).status).toBe(201);

    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
    await page.getByRole('heading', { level: 1, name: title }).waitFor();
    expect(await page.getByTestId('review-status').count()).toBe(0);
    await page.getByTestId('ask-for-review').click();
    const dialog = page.getByRole('dialog', { name: 'Ask for a review' });
    await dialog.getByRole('checkbox', { name: new RegExp(reviewer.name) }).check();
    await dialog.getByLabel(/What should they look at/).fill('Is the **crossover** high enough for the load steps?');
    await dialog.getByRole('button', { name: 'Ask for review' }).click();
    await page.waitForURL(/\/reviews\/\d+$/);
    await page.getByRole('heading', { level: 1, name: 'Review of version 1: For review' }).waitFor();
    expect(await page.locator('header [data-testid="review-state"]').getAttribute('data-state')).toBe('requested');

    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
    const status = page.getByTestId('review-status');
    await status.waitFor();
    expect(await status.getAttribute('data-state')).toBe('requested');
    expect(await status.getAttribute('data-version')).toBe('1');
  });

  it('the reviewer opens the review from the e-mail, sees the phase margin on the plot, pins a comment and asks for changes', async () => {
    const { page } = reviewerSession;
    await signIn(page, reviewer.login);
    const mail = await mailTo(reviewer.email, 'Review requested:', title);
    const link = /Open the review: (\S+)/.exec(mail.text)?.[1] ?? '';
    expect(link.startsWith(`${baseUrl}/notebooks/${notebookId}?review=`)).toBe(true);
    await page.goto(link);
    await page.waitForURL(/\/reviews\/\d+$/);
    await page.getByRole('heading', { level: 1, name: 'Review of version 1: For review' }).waitFor();

    const margin = await phaseMarginOnPlot(page);
    expect(margin.annotation).toMatch(/^phase margin [\d.]+° at [\d.]+ kHz$/);
    expect(Math.abs(marginIn(margin.annotation) - margin.readout)).toBeLessThan(0.05);
    // A reviewer reads the version; nothing in it can be edited.
    expect(await page.getByTestId('review-cells').locator('.cm-content').first().getAttribute('contenteditable')).toBe('false');

    // A click on the trace fills in the frequency; the comment box is next.
    const composer = page.getByTestId('pin-composer');
    await clickTraceNear(page, 1300);
    await expect.poll(() => composer.getByLabel('Frequency').inputValue(), { timeout: 15_000 }).toMatch(/^1\.\d+ kHz$/);
    await composer.getByLabel('Comment').fill('The loop crosses over at only **1.3 kHz**; we asked for 20 kHz.');
    await composer.getByRole('button', { name: 'Pin comment' }).click();
    const pins = page.getByTestId('pins').getByTestId('pin');
    await expect.poll(() => pins.count(), { timeout: 15_000 }).toBe(1);
    expect(await pins.first().textContent()).toContain('on loop out / inj');
    await page.getByTestId('review-cells').getByTestId('plot-bode').first().locator('.annotation-text', { hasText: /^P1$/ }).waitFor({ timeout: 15_000 });

    const decision = page.getByTestId('decision-controls');
    await decision.getByLabel(/Summary/).fill('Raise the crossover above 20 kHz: see P1.');
    await decision.getByRole('button', { name: 'Ask for changes' }).click();
    await page.locator('header [data-testid="review-state"][data-state="needs_changes"]').waitFor({ timeout: 15_000 });
    await page.getByTestId('review-history').locator('li[data-state="needs_changes"]').waitFor();
    await reviewShot(page, 'review-needs-changes');
  });

  it('the designer replies in the pin thread, makes a new version and asks again', async () => {
    const { page } = designerSession;
    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
    const status = page.getByTestId('review-status');
    await status.and(page.locator('[data-state="needs_changes"]')).waitFor({ timeout: 15_000 });
    await status.click();
    await page.waitForURL(/\/reviews\/\d+$/);
    const thread = page.getByTestId('pins').getByTestId('pin').first();
    await thread.getByRole('button', { name: 'Reply' }).click();
    await thread.getByLabel('Your reply').fill('Moved the zero up: **91k** and 1n, 10p across.');
    await thread.getByRole('button', { name: 'Send reply' }).click();
    await expect.poll(() => thread.getByTestId('pin-comment').count(), { timeout: 15_000 }).toBe(2);

    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
    await setCircuitText(page, 1, SECOND_LOOP);
    expect(await waitSaved(page, 1)).toBe(2);
    await cellAt(page, 1).locator('[data-readout="crossover"] dd').waitFor({ timeout: 30_000 });
    await page.getByRole('link', { name: 'Versions' }).click();
    await page.getByLabel('Make a version of every cell as it is now').fill('Type II compensation');
    await page.getByRole('button', { name: 'Make version' }).click();
    await page.getByText('Version 2 “Type II compensation” made.').waitFor();

    await page.goto(`${baseUrl}/notebooks/${notebookId}`);
    await page.getByTestId('ask-for-review').click();
    const dialog = page.getByRole('dialog', { name: 'Ask for a review' });
    await dialog.getByRole('checkbox', { name: new RegExp(reviewer.name) }).check();
    await dialog.getByRole('button', { name: 'Ask for review' }).click();
    await page.getByRole('heading', { level: 1, name: 'Review of version 2: Type II compensation' }).waitFor({ timeout: 15_000 });
    await page.getByTestId('rounds').waitFor();
    expect(await page.getByTestId('rounds').textContent()).toContain('Round 1 · version 1 · needs changes');
  });

  it('the reviewer reads the new version, with the old pin on its revision, and signs off', async () => {
    const { page } = reviewerSession;
    const mail = await mailTo(reviewer.email, `Review requested: “${title}”, version 2`, title);
    await page.goto(/Open the review: (\S+)/.exec(mail.text)?.[1] ?? '');
    await page.getByRole('heading', { level: 1, name: 'Review of version 2: Type II compensation' }).waitFor();
    const margin = await phaseMarginOnPlot(page);
    expect(Math.abs(marginIn(margin.annotation) - margin.readout)).toBeLessThan(0.05);
    // The type II compensation crosses over near 27 kHz now, as the requirement asks.
    expect(margin.annotation).toMatch(/ at 2\d\.\d+ kHz$/);
    const oldPin = page.getByTestId('pins').getByTestId('pin').first();
    await oldPin.waitFor();
    expect(await oldPin.getByTestId('pin-revision').textContent()).toBe('on revision 1');
    expect(await oldPin.getByTestId('pin-comment').count()).toBe(2);
    // The old pin sits on revision 1, so the new plot carries no marker for it.
    expect(await page.getByTestId('review-cells').locator('.annotation-text', { hasText: /^P1$/ }).count()).toBe(0);

    await oldPin.getByRole('button', { name: 'Resolve' }).click();
    await page.getByText('Every pin is resolved.').waitFor();
    await page.getByTestId('decision-controls').getByRole('button', { name: 'Sign off' }).click();
    await page.getByTestId('my-decision').waitFor({ timeout: 15_000 });
    expect(await page.locator('header [data-testid="review-state"]').getAttribute('data-state')).toBe('signed_off');
    await reviewShot(page, 'review-signed-off');

    const designerPage = designerSession.page;
    await designerPage.goto(`${baseUrl}/notebooks/${notebookId}`);
    await designerPage.getByTestId('review-status').and(designerPage.locator('[data-state="signed_off"][data-version="2"]')).waitFor({ timeout: 15_000 });
  });

  it('the mailbox holds what each of them was sent, each with a link back to the notebook', async () => {
    const link = `${baseUrl}/notebooks/${notebookId}`;
    const expected: [string, string][] = [
      [reviewer.email, `You were added to “${title}”`],
      [reviewer.email, `Review requested: “${title}”, version 1`],
      [designer.email, `Needs changes: “${title}”, version 1`],
      [reviewer.email, `New reply on a pin in “${title}”`],
      [reviewer.email, `Review requested: “${title}”, version 2`],
      [designer.email, `Signed off: “${title}”, version 2`],
    ];
    for (const [email, subject] of expected) {
      const mail = await mailTo(email, subject, title);
      expect(mail.text).toContain(link);
    }
    const all = await messagesAbout(title);
    expect(all).toHaveLength(expected.length);
    // Nobody mails the person who acted: Priya is not told of her own request or reply.
    expect(all.filter((m) => m.to.some((to) => to.includes(designer.email))).map((m) => m.subject.split(':')[0])).toEqual(['Signed off', 'Needs changes']);
  });
});
