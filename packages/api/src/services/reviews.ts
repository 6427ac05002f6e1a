/**
 * Review rounds. An editor asks members with the reviewer role or higher to review a version;
 * each reviewer moves from *requested* to *needs changes* or *signed off* (and from needs
 * changes to signed off), and a round for a later version supersedes the open one, which then
 * takes no more decisions. Every change locks the notebook row first, as cell saves do, so
 * two requests or decisions on one notebook queue up instead of racing.
 */
import type { EntityManager } from 'typeorm';
import type { ValidationIssue } from '../contract/common.js';
import type { DecisionState, Review, ReviewList, ReviewState, ReviewStatus } from '../contract/reviews.js';
import { Review as ReviewEntity, ReviewAssignment, ReviewDecision } from '../db/entities/review.js';
import { conflict, forbidden, notFound, validation } from '../errors.js';
import type { Actor } from '../policy.js';
import { presentReview, presentReviewStatus } from '../presenters/review.js';
import { loadNotebookFor } from './access.js';
import { inTransaction, managerOf, toInt } from './db.js';
import type { Database } from './db.js';
import { changedSinceVersion, insertVersion } from './versions.js';
import type { NotebookRow } from './access.js';

/** A review round with its version, its requester, and the notebook's latest round number. */
export interface ReviewRow {
  id: number;
  notebookId: string;
  round: number;
  versionId: number;
  versionNumber: number;
  versionLabel: string;
  requestedById: number | null;
  requestedByLogin: string | null;
  requestedByName: string | null;
  message: string;
  createdAt: Date;
  latestRound: number | string;
}

/** A person asked in a round, with their current state. */
export interface AssignmentRow {
  reviewId: number;
  reviewerId: number;
  login: string;
  name: string;
  state: ReviewState;
  summary: string;
  decidedAt: Date | null;
}

/** A decision of a round's history, with its reviewer (null when gone). */
export interface DecisionRow {
  reviewId: number;
  reviewerId: number | null;
  login: string | null;
  name: string | null;
  state: DecisionState;
  summary: string;
  createdAt: Date;
}

/** The label of a version made because a review was asked for a changed notebook. */
export const reviewVersionLabel = 'For review';

const reviewSelect = `
  SELECT rv.id, rv.notebookId, rv.round, rv.versionId, v.number AS versionNumber, v.label AS versionLabel,
         rv.requestedById, u.login AS requestedByLogin, u.name AS requestedByName, rv.message, rv.createdAt,
         (SELECT MAX(x.round) FROM reviews x WHERE x.notebookId = rv.notebookId) AS latestRound
    FROM reviews rv
    JOIN notebook_versions v ON v.id = rv.versionId
    LEFT JOIN users u ON u.id = rv.requestedById`;

async function assignmentsOf(manager: EntityManager, reviewIds: number[]): Promise<AssignmentRow[]> {
  if (reviewIds.length === 0) return [];
  return manager.query(
    `SELECT a.reviewId, a.reviewerId, u.login, u.name, a.state, a.summary, a.decidedAt
       FROM review_assignments a JOIN users u ON u.id = a.reviewerId
      WHERE a.reviewId IN (?)
      ORDER BY a.createdAt, a.reviewerId`,
    [reviewIds],
  );
}

async function decisionsOf(manager: EntityManager, reviewIds: number[]): Promise<DecisionRow[]> {
  if (reviewIds.length === 0) return [];
  return manager.query(
    `SELECT d.reviewId, d.reviewerId, u.login, u.name, d.state, d.summary, d.createdAt
       FROM review_decisions d LEFT JOIN users u ON u.id = d.reviewerId
      WHERE d.reviewId IN (?)
      ORDER BY d.createdAt, d.id`,
    [reviewIds],
  );
}

/** Rounds as JSON, each with its reviewers and history (three queries however many rounds). */
async function presentRounds(manager: EntityManager, rows: ReviewRow[]): Promise<Review[]> {
  const ids = rows.map((row) => row.id);
  // One after the other: inside a transaction both would share one connection anyway.
  const assignments = await assignmentsOf(manager, ids);
  const decisions = await decisionsOf(manager, ids);
  return rows.map((row) =>
    presentReview(
      row,
      assignments.filter((a) => a.reviewId === row.id),
      decisions.filter((d) => d.reviewId === row.id),
    ),
  );
}

async function reviewRow(manager: EntityManager, notebookId: string, reviewId: number): Promise<ReviewRow> {
  const rows: ReviewRow[] = await manager.query(`${reviewSelect} WHERE rv.notebookId = ? AND rv.id = ?`, [notebookId, reviewId]);
  if (!rows[0]) throw notFound('That review');
  return rows[0];
}

async function presentOne(manager: EntityManager, notebookId: string, reviewId: number): Promise<Review> {
  const [review] = await presentRounds(manager, [await reviewRow(manager, notebookId, reviewId)]);
  return review!;
}

/** `GET /api/notebooks/:id/reviews`: every round, newest first. */
export async function listReviews(db: Database, actor: Actor, notebookId: string): Promise<ReviewList> {
  const manager = managerOf(db);
  await loadNotebookFor(manager, actor, notebookId, 'read');
  const rows: ReviewRow[] = await manager.query(`${reviewSelect} WHERE rv.notebookId = ? ORDER BY rv.round DESC`, [notebookId]);
  return { items: await presentRounds(manager, rows) };
}

/** `GET /api/notebooks/:id/reviews/:reviewId`. */
export async function getReview(db: Database, actor: Actor, notebookId: string, reviewId: number): Promise<Review> {
  const manager = managerOf(db);
  await loadNotebookFor(manager, actor, notebookId, 'read');
  return presentOne(manager, notebookId, reviewId);
}

/** The notebook's latest round in brief, for its header; null before the first request. */
export async function reviewStatusOf(manager: EntityManager, notebookId: string): Promise<ReviewStatus | null> {
  const rows: { id: number; round: number; versionNumber: number }[] = await manager.query(
    `SELECT rv.id, rv.round, v.number AS versionNumber
       FROM reviews rv JOIN notebook_versions v ON v.id = rv.versionId
      WHERE rv.notebookId = ? ORDER BY rv.round DESC LIMIT 1`,
    [notebookId],
  );
  const latest = rows[0];
  if (!latest) return null;
  const states: { state: AssignmentRow['state'] }[] = await manager.query('SELECT state FROM review_assignments WHERE reviewId = ?', [latest.id]);
  return presentReviewStatus(
    latest,
    states.map((s) => s.state),
  );
}

/** Keeps the first of each id, in the order given. */
const distinct = (ids: number[]): number[] => [...new Set(ids)];

/**
 * Refuses anyone who may not review: the requester themselves, unknown or disabled people,
 * and members below the reviewer role (the owner always qualifies).
 */
async function checkReviewers(manager: EntityManager, actor: Actor, notebook: NotebookRow, reviewerIds: number[]): Promise<void> {
  const rows: { id: number; login: string; disabled: number; role: string | null }[] = await manager.query(
    `SELECT u.id, u.login, u.disabled, m.role
       FROM users u LEFT JOIN notebook_members m ON m.notebookId = ? AND m.userId = u.id
      WHERE u.id IN (?)`,
    [notebook.id, reviewerIds],
  );
  const byId = new Map(rows.map((row) => [row.id, row]));
  const issues: ValidationIssue[] = [];
  reviewerIds.forEach((id, index) => {
    const path = `reviewerIds.${index}`;
    const person = byId.get(id);
    if (id === actor.id) issues.push({ path, message: 'You cannot review your own request; ask someone else.' });
    else if (!person || person.disabled) issues.push({ path, message: `There is no active user ${id}.` });
    else if (id !== notebook.ownerId && person.role !== 'reviewer' && person.role !== 'editor') {
      issues.push({ path, message: `${person.login} is not a member with the reviewer role or higher; give them that role first.` });
    }
  });
  if (issues.length > 0) {
    throw validation(issues.map((issue) => `${issue.path}: ${issue.message}`).join('; '), { issues });
  }
}

/** The version to review: the one asked for, or the latest (a new one if the notebook changed since). */
async function versionToReview(manager: EntityManager, actor: Actor, notebookId: string, number: number | undefined): Promise<{ id: number; number: number }> {
  if (number !== undefined) {
    const rows: { id: number; number: number }[] = await manager.query('SELECT id, number FROM notebook_versions WHERE notebookId = ? AND number = ?', [
      notebookId,
      number,
    ]);
    if (!rows[0]) {
      throw validation(`versionNumber: this notebook has no version ${number}.`, {
        issues: [{ path: 'versionNumber', message: `This notebook has no version ${number}.` }],
      });
    }
    return rows[0];
  }
  const latest: { id: number; number: number }[] = await manager.query(
    'SELECT id, number FROM notebook_versions WHERE notebookId = ? ORDER BY number DESC LIMIT 1',
    [notebookId],
  );
  if (latest[0] && !(await changedSinceVersion(manager, notebookId, latest[0].id))) return latest[0];
  const made = await insertVersion(manager, actor, notebookId, reviewVersionLabel);
  const rows: { id: number; number: number }[] = await manager.query('SELECT id, number FROM notebook_versions WHERE notebookId = ? AND number = ?', [
    notebookId,
    made,
  ]);
  return rows[0]!;
}

export interface ReviewRequested {
  /** True when a new round started (201); false when people were added to the open round (200). */
  created: boolean;
  review: Review;
  /** The people asked by this request (those already in the round are not asked twice). */
  askedIds: number[];
}

/** `POST /api/notebooks/:id/reviews` (editor or owner). */
export async function requestReview(
  db: Database,
  actor: Actor,
  notebookId: string,
  input: { reviewerIds: number[]; versionNumber?: number; message: string },
): Promise<ReviewRequested> {
  return inTransaction(db, async (manager) => {
    const notebook = await loadNotebookFor(manager, actor, notebookId, 'edit', { lock: true });
    const reviewerIds = distinct(input.reviewerIds);
    await checkReviewers(manager, actor, notebook, reviewerIds);
    const version = await versionToReview(manager, actor, notebookId, input.versionNumber);
    const open: { id: number; round: number; versionId: number; versionNumber: number }[] = await manager.query(
      `SELECT rv.id, rv.round, rv.versionId, v.number AS versionNumber
         FROM reviews rv JOIN notebook_versions v ON v.id = rv.versionId
        WHERE rv.notebookId = ? ORDER BY rv.round DESC LIMIT 1`,
      [notebookId],
    );
    const now = new Date();
    const current = open[0];

    if (current && current.versionId === version.id) {
      const asked: { reviewerId: number }[] = await manager.query('SELECT reviewerId FROM review_assignments WHERE reviewId = ?', [current.id]);
      const already = new Set(asked.map((a) => a.reviewerId));
      const askedIds = reviewerIds.filter((id) => !already.has(id));
      if (askedIds.length === 0) {
        throw conflict(`Everyone named is already asked to review version ${version.number} in round ${current.round}.`);
      }
      await manager.insert(
        ReviewAssignment,
        askedIds.map((reviewerId) => ({ reviewId: current.id, reviewerId, state: 'requested' as const, summary: '', createdAt: now, decidedAt: null })),
      );
      return { created: false, review: await presentOne(manager, notebookId, current.id), askedIds };
    }
    if (current && current.versionNumber > version.number) {
      throw conflict(
        `Round ${current.round} reviews version ${current.versionNumber}, which is newer than version ${version.number}; ask for a review of version ${current.versionNumber} or a later one.`,
      );
    }

    const round = (current?.round ?? 0) + 1;
    const inserted = await manager.insert(ReviewEntity, {
      notebookId,
      round,
      versionId: version.id,
      requestedById: actor.id,
      message: input.message,
      createdAt: now,
    });
    const reviewId = Number(inserted.identifiers[0]?.id);
    await manager.insert(
      ReviewAssignment,
      reviewerIds.map((reviewerId) => ({ reviewId, reviewerId, state: 'requested' as const, summary: '', createdAt: now, decidedAt: null })),
    );
    return { created: true, review: await presentOne(manager, notebookId, reviewId), askedIds: reviewerIds };
  });
}

/**
 * `POST …/reviews/:reviewId/decision`: an assigned reviewer of the open round asks for
 * changes or signs off. Refused: anyone not asked in the round (403), a superseded round,
 * a second request for changes, and any decision after a sign-off (409).
 */
export async function decideReview(
  db: Database,
  actor: Actor,
  notebookId: string,
  reviewId: number,
  input: { state: DecisionState; summary: string },
): Promise<Review> {
  return inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'review', { lock: true });
    const review = await reviewRow(manager, notebookId, reviewId);
    const mine: { state: AssignmentRow['state'] }[] = await manager.query(
      'SELECT state FROM review_assignments WHERE reviewId = ? AND reviewerId = ? FOR UPDATE',
      [reviewId, actor.id],
    );
    if (!mine[0]) throw forbidden(`Only the people asked to review in round ${review.round} can decide on it, and you were not asked.`);
    const latestRound = toInt(review.latestRound);
    if (review.round < latestRound) {
      throw conflict(`Round ${review.round} was superseded by round ${latestRound}; decide on round ${latestRound} instead.`);
    }
    if (mine[0].state === 'signed_off') {
      throw conflict(`You already signed off round ${review.round}; a sign-off is final for its round (changes need a new version and a new round).`);
    }
    if (mine[0].state === 'needs_changes' && input.state === 'needs_changes') {
      throw conflict(`You already asked for changes in round ${review.round}; sign off once they are made, or reply on a pin.`);
    }
    const now = new Date();
    await manager.update(ReviewAssignment, { reviewId, reviewerId: actor.id }, { state: input.state, summary: input.summary, decidedAt: now });
    await manager.insert(ReviewDecision, { reviewId, reviewerId: actor.id, state: input.state, summary: input.summary, createdAt: now });
    return presentOne(manager, notebookId, reviewId);
  });
}
