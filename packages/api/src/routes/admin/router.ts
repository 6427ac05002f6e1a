import { Router } from 'express';
import { actorOf, requireUser } from '../../auth/require-user.js';
import { AdminUserUpdateSchema } from '../../contract/users.js';
import { connect } from '../../db/connection.js';
import { outboxOf } from '../../mail/notifier.js';
import { authorizeSite } from '../../policy.js';
import { listUsers, updateUser } from '../../services/users.js';
import { validate } from '../../validate.js';
import { UserParamsSchema } from '../params.js';

/** `/api/admin`: site admins list people, change site roles, disable and enable; and see how mail goes out. */
export const adminRouter = Router();
adminRouter.use(requireUser);

adminRouter.get('/users', async (req, res) => {
  res.json(await listUsers(await connect(), actorOf(req)));
});

const update = validate({ params: UserParamsSchema, body: AdminUserUpdateSchema });
adminRouter.patch('/users/:userId', update, async (req, res) => {
  const { params, body } = update.input(req);
  res.json(await updateUser(await connect(), actorOf(req), params.userId, body));
});

adminRouter.get('/mail', async (req, res) => {
  authorizeSite(actorOf(req), 'read-mail-status');
  res.set('cache-control', 'no-store');
  res.json(await outboxOf(req).status());
});
