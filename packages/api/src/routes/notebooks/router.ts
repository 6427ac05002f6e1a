/** `/api/notebooks`: the list, create, read, rename / link sharing, delete and restore. */
import { Router } from 'express';
import { actorOf, requireUser } from '../../auth/require-user.js';
import { NotebookCreateSchema, NotebookListQuerySchema, NotebookUpdateSchema } from '../../contract/notebooks.js';
import { connect } from '../../db/connection.js';
import { createNotebook, deleteNotebook, getNotebook, listNotebooks, restoreNotebook, updateNotebook } from '../../services/notebooks.js';
import { validate } from '../../validate.js';
import { activityRouter } from '../activity/router.js';
import { cellsRouter } from '../cells/router.js';
import { forksRouter } from '../forks/router.js';
import { membersRouter } from '../members/router.js';
import { answerOnce } from '../idempotency.js';
import { NotebookParamsSchema } from '../params.js';
import { pinsRouter } from '../pins/router.js';
import { reviewsRouter } from '../reviews/router.js';
import { versionsRouter } from '../versions/router.js';

export const notebooksRouter = Router();
notebooksRouter.use(requireUser);

const list = validate({ query: NotebookListQuerySchema });
notebooksRouter.get('/', list, async (req, res) => {
  res.json(await listNotebooks(await connect(), actorOf(req), list.input(req).query));
});

const create = validate({ body: NotebookCreateSchema });
notebooksRouter.post('/', create, async (req, res) => {
  await answerOnce(req, res, async (once) => ({ status: 201, body: await createNotebook(await connect(), actorOf(req), create.input(req).body, once) }));
});

const one = validate({ params: NotebookParamsSchema });
notebooksRouter.get('/:id', one, async (req, res) => {
  res.json(await getNotebook(await connect(), actorOf(req), one.input(req).params.id));
});

const update = validate({ params: NotebookParamsSchema, body: NotebookUpdateSchema });
notebooksRouter.patch('/:id', update, async (req, res) => {
  const { params, body } = update.input(req);
  res.json(await updateNotebook(await connect(), actorOf(req), params.id, body));
});

notebooksRouter.delete('/:id', one, async (req, res) => {
  await deleteNotebook(await connect(), actorOf(req), one.input(req).params.id);
  res.status(204).end();
});

notebooksRouter.post('/:id/restore', one, async (req, res) => {
  res.json(await restoreNotebook(await connect(), actorOf(req), one.input(req).params.id));
});

notebooksRouter.use('/:id/cells', cellsRouter);
notebooksRouter.use('/:id/versions', versionsRouter);
notebooksRouter.use('/:id/forks', forksRouter);
notebooksRouter.use('/:id/members', membersRouter);
notebooksRouter.use('/:id/reviews', reviewsRouter);
notebooksRouter.use('/:id/pins', pinsRouter);
notebooksRouter.use('/:id/activity', activityRouter);
