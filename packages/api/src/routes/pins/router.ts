/** `/api/notebooks/:id/pins`: pins at a frequency, their threads, resolve and reopen. */
import { Router } from 'express';
import { actorOf } from '../../auth/require-user.js';
import { PinCommentCreateSchema, PinCreateSchema, PinListQuerySchema } from '../../contract/pins.js';
import { connect } from '../../db/connection.js';
import { withMail } from '../../mail/notifier.js';
import { addPinComment, createPin, listPins, setPinResolved } from '../../services/pins.js';
import { validate } from '../../validate.js';
import { NotebookParamsSchema, PinParamsSchema } from '../params.js';

export const pinsRouter = Router({ mergeParams: true });

const list = validate({ params: NotebookParamsSchema, query: PinListQuerySchema });
pinsRouter.get('/', list, async (req, res) => {
  const { params, query } = list.input(req);
  res.json(await listPins(await connect(), actorOf(req), params.id, query));
});

const create = validate({ params: NotebookParamsSchema, body: PinCreateSchema });
pinsRouter.post('/', create, async (req, res) => {
  const { params, body } = create.input(req);
  res.status(201).json(await createPin(await connect(), actorOf(req), params.id, body));
});

const reply = validate({ params: PinParamsSchema, body: PinCommentCreateSchema });
pinsRouter.post('/:pinId/comments', reply, async (req, res) => {
  const { params, body } = reply.input(req);
  const actor = actorOf(req);
  const { pin } = await withMail(req, actor, async (manager, mail) => {
    const replied = await addPinComment(manager, actor, params.id, params.pinId, body.body);
    await mail.pinReplied(replied);
    return replied;
  });
  res.status(201).json(pin);
});

const one = validate({ params: PinParamsSchema });
pinsRouter.post('/:pinId/resolve', one, async (req, res) => {
  const { params } = one.input(req);
  res.json(await setPinResolved(await connect(), actorOf(req), params.id, params.pinId, true));
});

pinsRouter.post('/:pinId/reopen', one, async (req, res) => {
  const { params } = one.input(req);
  res.json(await setPinResolved(await connect(), actorOf(req), params.id, params.pinId, false));
});
