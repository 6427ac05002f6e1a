/** `/api/notebooks/:id/versions`: make a labelled snapshot, list them, read one. */
import { Router } from 'express';
import { actorOf } from '../../auth/require-user.js';
import { VersionCreateSchema } from '../../contract/versions.js';
import { connect } from '../../db/connection.js';
import { createVersion, getVersion, listVersions } from '../../services/versions.js';
import { validate } from '../../validate.js';
import { answerOnce } from '../idempotency.js';
import { NotebookParamsSchema, VersionParamsSchema } from '../params.js';

export const versionsRouter = Router({ mergeParams: true });

const create = validate({ params: NotebookParamsSchema, body: VersionCreateSchema });
versionsRouter.post('/', create, async (req, res) => {
  const { params, body } = create.input(req);
  await answerOnce(req, res, async () => ({ status: 201, body: await createVersion(await connect(), actorOf(req), params.id, body.label) }));
});

const list = validate({ params: NotebookParamsSchema });
versionsRouter.get('/', list, async (req, res) => {
  res.json(await listVersions(await connect(), actorOf(req), list.input(req).params.id));
});

const one = validate({ params: VersionParamsSchema });
versionsRouter.get('/:number', one, async (req, res) => {
  const { params } = one.input(req);
  res.json(await getVersion(await connect(), actorOf(req), params.id, params.number));
});
