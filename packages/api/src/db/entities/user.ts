import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

export type SiteRole = 'admin' | 'member';

/**
 * The user that stands for Rolloff itself as the author of the revisions it makes (the
 * language update). Its login is one GitHub never gives out (logins start with a letter or
 * digit), and it is disabled, so no one signs in as it; screens show its name.
 */
export const SYSTEM_USER = { login: '_rolloff', name: 'Rolloff' } as const;

/** A person who signs in with GitHub (or the local stand-in). */
@Entity({ name: 'users' })
export class User {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 100, unique: true })
  login!: string;

  @Column({ type: 'varchar', length: 200, default: '' })
  name!: string;

  @Column({ type: 'varchar', length: 320, nullable: true })
  email!: string | null;

  @Column({ type: 'varchar', length: 20, default: 'member' })
  siteRole!: SiteRole;

  @Column({ type: 'boolean', default: false })
  disabled!: boolean;

  /** GitHub's numeric user id (as text); null until the person first signs in. */
  @Column({ type: 'varchar', length: 40, nullable: true, unique: true })
  githubId!: string | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lastSignInAt!: Date | null;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
