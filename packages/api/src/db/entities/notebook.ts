import { Column, Entity, PrimaryColumn } from 'typeorm';

export type Visibility = 'private' | 'link';

/** A notebook: ordered cells owned by one person, shared with members or by link. */
@Entity({ name: 'notebooks' })
export class Notebook {
  /** Random and URL-safe (12 characters), so a shared link cannot be guessed. */
  @PrimaryColumn({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin' })
  id!: string;

  @Column({ type: 'varchar', length: 200 })
  title!: string;

  /** Plain text under the title (never rendered as Markdown); empty when there is none. */
  @Column({ type: 'varchar', length: 2000, default: '' })
  description!: string;

  @Column({ type: 'int', unsigned: true })
  ownerId!: number;

  @Column({ type: 'varchar', length: 10, default: 'private' })
  visibility!: Visibility;

  @Column({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin', nullable: true })
  forkedFromId!: string | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  forkedFromVersionId!: number | null;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  /** The last change to the notebook or any of its cells; lists sort by it. */
  @Column({ type: 'datetime', precision: 3 })
  updatedAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  deletedAt!: Date | null;
}
