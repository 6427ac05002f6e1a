/** `/api/notebooks/:id/forks`: fork the notebook (or one of its versions); list its forks. */
import { Router } from 'express';
import { actorOf } from '../../auth/require-user.js';
import { ForkCreateSchema } from '../../contract/forks.js';
import { connect } from '../../db/connection.js';
import { forkNotebook, listForks } from '../../services/forks.js';
import { validate } from '../../validate.js';
import { answerOnce } from '../idempotency.js';
import { NotebookParamsSchema } from '../params.js';

export const forksRouter = Router({ mergeParams: true });

const create = validate({ params: NotebookParamsSchema, body: ForkCreateSchema });
forksRouter.post('/', create, async (req, res) => {
  const { params, body } = create.input(req);
  await answerOnce(req, res, async () => ({ status: 201, body: await forkNotebook(await connect(), actorOf(req), params.id, body) }));
});

const list = validate({ params: NotebookParamsSchema });
forksRouter.get('/', list, async (req, res) => {
  res.json(await listForks(await connect(), actorOf(req), list.input(req).params.id));
});
