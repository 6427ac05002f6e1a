import { Column, Entity, PrimaryColumn, PrimaryGeneratedColumn } from 'typeorm';

export type ReviewState = 'requested' | 'needs_changes' | 'signed_off';

/** A review round: one version of a notebook, asked of one or more reviewers. */
@Entity({ name: 'reviews' })
export class Review {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin' })
  notebookId!: string;

  /** 1, 2, … within the notebook; the highest is the open round, the others are superseded. */
  @Column({ type: 'int', unsigned: true })
  round!: number;

  @Column({ type: 'int', unsigned: true })
  versionId!: number;

  @Column({ type: 'int', unsigned: true, nullable: true })
  requestedById!: number | null;

  /** What the requester asked the reviewers to look at (Markdown). */
  @Column({ type: 'text' })
  message!: string;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}

/** One person asked in a round, and where their decision stands. */
@Entity({ name: 'review_assignments' })
export class ReviewAssignment {
  @PrimaryColumn({ type: 'int', unsigned: true })
  reviewId!: number;

  @PrimaryColumn({ type: 'int', unsigned: true })
  reviewerId!: number;

  @Column({ type: 'varchar', length: 20, default: 'requested' })
  state!: ReviewState;

  /** The latest decision's summary (Markdown); empty until they decide. */
  @Column({ type: 'text' })
  summary!: string;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  decidedAt!: Date | null;
}

/** A decision as it was made; rows are inserted, never updated, so a round keeps its history. */
@Entity({ name: 'review_decisions' })
export class ReviewDecision {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  reviewId!: number;

  @Column({ type: 'int', unsigned: true, nullable: true })
  reviewerId!: number | null;

  @Column({ type: 'varchar', length: 20 })
  state!: Exclude<ReviewState, 'requested'>;

  @Column({ type: 'text' })
  summary!: string;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
