import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { disconnect } from '../../db/connection.js';
import { Client, signedIn } from '../../../test/client.js';
import { buildNotebook, buildUser } from '../../../test/factories.js';
import { startTestServer, testAdminLogins } from '../../../test/http.js';
import type { TestServer } from '../../../test/http.js';

describe('GET /dev/mail', () => {
  let withMailbox: TestServer;
  let without: TestServer;
  beforeAll(async () => {
    withMailbox = await startTestServer({ devMail: true });
    without = await startTestServer();
  });
  afterAll(async () => {
    await withMailbox.close();
    await without.close();
    await disconnect();
  });

  it('is not there unless the server runs with the mail stand-in', async () => {
    const reply = await (await signedIn(without.url, testAdminLogins[0]!)).get('/dev/mail');
    expect(reply.status).toBe(404);
    expect(reply.text).not.toContain('Mailbox');
  });

  it('is not there signed out, and is for site admins only when signed in', async () => {
    const signedOut = await new Client(withMailbox.url).get('/dev/mail');
    expect(signedOut.status).toBe(404);
    expect(signedOut.text).not.toContain('Mailbox');
    const member = await buildUser();
    const asMember = await (await signedIn(withMailbox.url, member.login)).get('/dev/mail');
    expect(asMember.status).toBe(403);
    expect(asMember.body).toMatchObject({ error: 'forbidden', message: 'Only a site admin may read the development mailbox.' });
  });

  it('lists what the stand-in received, newest first, with every value escaped and links made links', async () => {
    const newcomer = await buildUser();
    const notebook = await buildNotebook({ title: 'Tone <script>alert(1)</script> & "bass"' });
    const owner = await signedIn(withMailbox.url, notebook.ownerUser.login);
    await owner.put(`/api/notebooks/${notebook.id}/members/${newcomer.id}`, { role: 'viewer' });
    const other = await buildNotebook({ owner: notebook.ownerUser, title: 'Second notebook' });
    await owner.put(`/api/notebooks/${other.id}/members/${newcomer.id}`, { role: 'editor' });
    await withMailbox.mailbox();

    const admin = await signedIn(withMailbox.url, testAdminLogins[0]!);
    const page = await admin.get('/dev/mail');
    expect(page.status).toBe(200);
    expect(page.headers.get('content-type')).toMatch(/^text\/html/);
    expect(page.headers.get('content-security-policy')).toContain("default-src 'none'");
    expect(page.text).not.toContain('<script>alert(1)</script>');
    expect(page.text).toContain('Tone &lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;bass&quot;');
    expect(page.text).toContain(`<dd>${newcomer.email}</dd>`);
    const link = `${withMailbox.url}/notebooks/${other.id}`;
    expect(page.text).toContain(`<a href="${link}">${link}</a>`);
    // The second notebook's mail was received last, so it comes first.
    expect(page.text.indexOf('Second notebook')).toBeLessThan(page.text.indexOf('Tone &lt;script'));
    expect(page.text.match(/data-testid="mail-message"/g)?.length).toBeGreaterThanOrEqual(2);
  });

  it('says so when the stand-in does not answer', async () => {
    await withMailbox.smtp.close();
    const reply = await (await signedIn(withMailbox.url, testAdminLogins[0]!)).get('/dev/mail');
    expect(reply.status).toBe(502);
    expect(reply.text).toContain('does not answer');
  });
});
