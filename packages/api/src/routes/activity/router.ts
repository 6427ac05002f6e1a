/** `/api/notebooks/:id/activity`: the notebook's timeline, newest first, paged. */
import { Router } from 'express';
import { actorOf } from '../../auth/require-user.js';
import { PageQuerySchema } from '../../contract/common.js';
import { connect } from '../../db/connection.js';
import { listActivity } from '../../services/activity.js';
import { validate } from '../../validate.js';
import { NotebookParamsSchema } from '../params.js';

export const activityRouter = Router({ mergeParams: true });

const list = validate({ params: NotebookParamsSchema, query: PageQuerySchema });
activityRouter.get('/', list, async (req, res) => {
  const { params, query } = list.input(req);
  res.json(await listActivity(await connect(), actorOf(req), params.id, query));
});
