import { Column, Entity, PrimaryColumn } from 'typeorm';

export type MemberRole = 'editor' | 'reviewer' | 'viewer';

/** A person's role in a notebook they do not own. */
@Entity({ name: 'notebook_members' })
export class NotebookMember {
  @PrimaryColumn({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin' })
  notebookId!: string;

  @PrimaryColumn({ type: 'int', unsigned: true })
  userId!: number;

  @Column({ type: 'varchar', length: 10 })
  role!: MemberRole;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
