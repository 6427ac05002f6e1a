/** `/api/notebooks/:id/members`: who has which role; the owner gives, changes and removes roles (a newcomer gets an e-mail). */
import { Router } from 'express';
import { actorOf } from '../../auth/require-user.js';
import { MemberPutSchema } from '../../contract/members.js';
import { connect } from '../../db/connection.js';
import { withMail } from '../../mail/notifier.js';
import { listMembers, putMember, removeMember } from '../../services/members.js';
import { validate } from '../../validate.js';
import { MemberParamsSchema, NotebookParamsSchema } from '../params.js';

export const membersRouter = Router({ mergeParams: true });

const list = validate({ params: NotebookParamsSchema });
membersRouter.get('/', list, async (req, res) => {
  res.json(await listMembers(await connect(), actorOf(req), list.input(req).params.id));
});

const put = validate({ params: MemberParamsSchema, body: MemberPutSchema });
membersRouter.put('/:userId', put, async (req, res) => {
  const { params, body } = put.input(req);
  const actor = actorOf(req);
  const { created, member } = await withMail(req, actor, async (manager, mail) => {
    const put = await putMember(manager, actor, params.id, params.userId, body.role);
    // Only a newcomer is told; a changed role shows in the notebook itself.
    if (put.created) await mail.memberAdded({ notebookId: params.id, userId: params.userId, role: body.role });
    return put;
  });
  res.status(created ? 201 : 200).json(member);
});

const remove = validate({ params: MemberParamsSchema });
membersRouter.delete('/:userId', remove, async (req, res) => {
  const { params } = remove.input(req);
  await removeMember(await connect(), actorOf(req), params.id, params.userId);
  res.status(204).end();
});
