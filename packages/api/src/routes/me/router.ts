import { Router } from 'express';
import { actorOf, requireUser } from '../../auth/require-user.js';
import type { Me } from '../../contract/users.js';

/** `GET /api/me`: who is signed in (401 when nobody is). */
export const meRouter = Router();

meRouter.get('/', requireUser, (req, res) => {
  const user = actorOf(req);
  const body: Me = { id: user.id, login: user.login, name: user.name, email: user.email, siteRole: user.siteRole };
  res.json(body);
});
