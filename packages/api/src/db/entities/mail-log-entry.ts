import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

export type MailStatus = 'queued' | 'sent' | 'failed';

/** One message to one address: queued when the change that caused it was stored, then sent or failed. */
@Entity({ name: 'mail_log' })
export class MailLogEntry {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 320 })
  toAddress!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  userId!: number | null;

  @Column({ type: 'varchar', length: 300 })
  subject!: string;

  /** The preference that governs it: reviewRequests, reviewDecisions, pinReplies, addedToNotebook. */
  @Column({ type: 'varchar', length: 30 })
  kind!: string;

  @Column({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin', nullable: true })
  notebookId!: string | null;

  @Column({ type: 'varchar', length: 10, default: 'queued' })
  status!: MailStatus;

  @Column({ type: 'int', unsigned: true, default: 0 })
  attempts!: number;

  @Column({ type: 'varchar', length: 1000, nullable: true })
  error!: string | null;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  finishedAt!: Date | null;
}
