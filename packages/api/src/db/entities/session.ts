import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One express-session session; `userId` lets disabling a user end their sessions at once. */
@Entity({ name: 'sessions' })
export class Session {
  @PrimaryColumn({ type: 'varchar', length: 128 })
  id!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  userId!: number | null;

  /** The session's JSON. */
  @Column({ type: 'mediumtext' })
  data!: string;

  @Column({ type: 'datetime', precision: 3 })
  expiresAt!: Date;
}
