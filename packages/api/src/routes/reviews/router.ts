/** `/api/notebooks/:id/reviews`: ask for a review of a version, read the rounds, decide. */
import { Router } from 'express';
import { actorOf } from '../../auth/require-user.js';
import { ReviewCreateSchema, ReviewDecisionCreateSchema } from '../../contract/reviews.js';
import { connect } from '../../db/connection.js';
import { withMail } from '../../mail/notifier.js';
import { decideReview, getReview, listReviews, requestReview } from '../../services/reviews.js';
import { validate } from '../../validate.js';
import { NotebookParamsSchema, ReviewParamsSchema } from '../params.js';

export const reviewsRouter = Router({ mergeParams: true });

const create = validate({ params: NotebookParamsSchema, body: ReviewCreateSchema });
reviewsRouter.post('/', create, async (req, res) => {
  const { params, body } = create.input(req);
  const actor = actorOf(req);
  const { created, review } = await withMail(req, actor, async (manager, mail) => {
    const requested = await requestReview(manager, actor, params.id, body);
    await mail.reviewRequested(requested);
    return requested;
  });
  res.status(created ? 201 : 200).json(review);
});

const list = validate({ params: NotebookParamsSchema });
reviewsRouter.get('/', list, async (req, res) => {
  res.json(await listReviews(await connect(), actorOf(req), list.input(req).params.id));
});

const one = validate({ params: ReviewParamsSchema });
reviewsRouter.get('/:reviewId', one, async (req, res) => {
  const { params } = one.input(req);
  res.json(await getReview(await connect(), actorOf(req), params.id, params.reviewId));
});

const decide = validate({ params: ReviewParamsSchema, body: ReviewDecisionCreateSchema });
reviewsRouter.post('/:reviewId/decision', decide, async (req, res) => {
  const { params, body } = decide.input(req);
  const actor = actorOf(req);
  const review = await withMail(req, actor, async (manager, mail) => {
    const decided = await decideReview(manager, actor, params.id, params.reviewId, body);
    await mail.reviewDecided({ review: decided, state: body.state, summary: body.summary });
    return decided;
  });
  res.json(review);
});
