/** `/api/notebooks/:id/cells`: add, save (a new revision), move, delete, restore; revisions. */
import { Router } from 'express';
import { actorOf } from '../../auth/require-user.js';
import { CellCreateSchema, CellMoveSchema, CellSaveSchema, CellTitleUpdateSchema, RevisionRestoreSchema } from '../../contract/cells.js';
import { PageQuerySchema } from '../../contract/common.js';
import { connect } from '../../db/connection.js';
import { createCell, deleteCell, getRevision, listRevisions, moveCell, restoreCell, restoreRevision, saveCell, setCellTitle } from '../../services/cells.js';
import { validate } from '../../validate.js';
import { answerOnce } from '../idempotency.js';
import { CellParamsSchema, NotebookParamsSchema, RevisionParamsSchema } from '../params.js';

export const cellsRouter = Router({ mergeParams: true });

const create = validate({ params: NotebookParamsSchema, body: CellCreateSchema });
cellsRouter.post('/', create, async (req, res) => {
  const { params, body } = create.input(req);
  await answerOnce(req, res, async (once) => ({ status: 201, body: await createCell(await connect(), actorOf(req), params.id, body, once) }));
});

const save = validate({ params: CellParamsSchema, body: CellSaveSchema });
cellsRouter.put('/:cellId', save, async (req, res) => {
  const { params, body } = save.input(req);
  await answerOnce(req, res, async (once) => {
    const outcome = await saveCell(await connect(), actorOf(req), params.id, params.cellId, body, null, once);
    return { status: outcome.created ? 201 : 200, body: outcome.body };
  });
});

const title = validate({ params: CellParamsSchema, body: CellTitleUpdateSchema });
cellsRouter.patch('/:cellId', title, async (req, res) => {
  const { params, body } = title.input(req);
  res.json(await setCellTitle(await connect(), actorOf(req), params.id, params.cellId, body.title));
});

const move = validate({ params: CellParamsSchema, body: CellMoveSchema });
cellsRouter.post('/:cellId/move', move, async (req, res) => {
  const { params, body } = move.input(req);
  res.json(await moveCell(await connect(), actorOf(req), params.id, params.cellId, body.position));
});

const one = validate({ params: CellParamsSchema });
cellsRouter.delete('/:cellId', one, async (req, res) => {
  const { params } = one.input(req);
  res.json(await deleteCell(await connect(), actorOf(req), params.id, params.cellId));
});

cellsRouter.post('/:cellId/restore', one, async (req, res) => {
  const { params } = one.input(req);
  res.json(await restoreCell(await connect(), actorOf(req), params.id, params.cellId));
});

const revisions = validate({ params: CellParamsSchema, query: PageQuerySchema });
cellsRouter.get('/:cellId/revisions', revisions, async (req, res) => {
  const { params, query } = revisions.input(req);
  res.json(await listRevisions(await connect(), actorOf(req), params.id, params.cellId, query));
});

const revision = validate({ params: RevisionParamsSchema });
cellsRouter.get('/:cellId/revisions/:number', revision, async (req, res) => {
  const { params } = revision.input(req);
  res.json(await getRevision(await connect(), actorOf(req), params.id, params.cellId, params.number));
});

const restoreOne = validate({ params: RevisionParamsSchema, body: RevisionRestoreSchema });
cellsRouter.post('/:cellId/revisions/:number/restore', restoreOne, async (req, res) => {
  const { params, body } = restoreOne.input(req);
  await answerOnce(req, res, async (once) => {
    const outcome = await restoreRevision(await connect(), actorOf(req), params.id, params.cellId, params.number, body, once);
    return { status: outcome.created ? 201 : 200, body: outcome.body };
  });
});
