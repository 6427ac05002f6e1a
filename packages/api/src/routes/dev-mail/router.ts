/**
 * `GET /dev/mail`: the development mailbox, mounted only when the server runs with the SMTP
 * stand-in (MAIL_STANDIN_URL names its HTTP mailbox). It reads the stand-in on every request.
 * It holds everyone's mail (reviews of private notebooks too), so only a signed-in site admin
 * reads it: signed out it is not there (404, as without the stand-in), and a signed-in member
 * is told it is for admins (403).
 */
import { Router } from 'express';
import { notFound } from '../../errors.js';
import { authorizeSite } from '../../policy.js';
import { MailboxReplySchema } from './mailbox.js';
import type { MailboxMessage } from './mailbox.js';
import { mailboxDownPage, mailboxPage } from './page.js';

export function devMailRouter(standinUrl: string): Router {
  const router = Router();
  router.get('/', async (req, res) => {
    if (!req.user || req.user.disabled) throw notFound('That page');
    authorizeSite(req.user, 'read-dev-mail');
    res.set('cache-control', 'no-store');
    // The page is static markup: no script may run in it, whatever a message holds.
    res.set('content-security-policy', "default-src 'none'; style-src 'unsafe-inline'");
    let messages: MailboxMessage[];
    try {
      const reply = await fetch(`${standinUrl}/messages`, { signal: AbortSignal.timeout(3000) });
      if (!reply.ok) throw new Error(`it answered ${reply.status}`);
      const parsed = MailboxReplySchema.safeParse(await reply.json());
      if (!parsed.success) throw new Error('its reply is not a list of messages');
      messages = parsed.data.messages;
    } catch (error) {
      res
        .status(502)
        .type('html')
        .send(mailboxDownPage(standinUrl, (error as Error).message));
      return;
    }
    // The stand-in lists newest first already; sorting again keeps the page right if it ever does not.
    messages.sort((a, b) => b.receivedAt.localeCompare(a.receivedAt) || b.id - a.id);
    res.type('html').send(mailboxPage(messages));
  });
  return router;
}
