import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * A message still to be sent: its mail_log row holds the address, subject and outcome; this
 * row the text and when it may next be tried. Gone once the message is sent or given up on.
 */
@Entity({ name: 'mail_outbox' })
export class MailOutboxEntry {
  @PrimaryColumn({ type: 'int', unsigned: true })
  mailLogId!: number;

  @Column({ type: 'mediumtext' })
  body!: string;

  @Column({ type: 'datetime', precision: 3 })
  nextAttemptAt!: Date;

  /** Set while a sender has it; once past, any sender may claim it again (the sender died). */
  @Column({ type: 'datetime', precision: 3, nullable: true })
  claimedUntil!: Date | null;
}
