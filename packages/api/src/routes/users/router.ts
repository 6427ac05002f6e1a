import { Router } from 'express';
import { requireUser } from '../../auth/require-user.js';
import { UserSearchQuerySchema } from '../../contract/users.js';
import { connect } from '../../db/connection.js';
import { searchUsers } from '../../services/users.js';
import { validate } from '../../validate.js';

/** `GET /api/users?q=`: people a notebook can be shared with (login and name only). */
export const usersRouter = Router();

const search = validate({ query: UserSearchQuerySchema });
usersRouter.get('/', requireUser, search, async (req, res) => {
  res.json(await searchUsers(await connect(), search.input(req).query.q));
});
