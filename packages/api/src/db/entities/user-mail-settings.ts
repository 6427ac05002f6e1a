import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A person's choice of e-mails; without a row every kind is on. */
@Entity({ name: 'user_mail_settings' })
export class UserMailSettings {
  @PrimaryColumn({ type: 'int', unsigned: true })
  userId!: number;

  @Column({ type: 'boolean', default: true })
  reviewRequests!: boolean;

  @Column({ type: 'boolean', default: true })
  reviewDecisions!: boolean;

  @Column({ type: 'boolean', default: true })
  pinReplies!: boolean;

  @Column({ type: 'boolean', default: true })
  addedToNotebook!: boolean;

  @Column({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
