import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A comment pinned to a cell revision's trace at a frequency; its thread is in pin_comments. */
@Entity({ name: 'pins' })
export class Pin {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin' })
  notebookId!: string;

  @Column({ type: 'int', unsigned: true })
  cellId!: number;

  /** The revision of the cell the pin was made on; it stays there as the cell moves on. */
  @Column({ type: 'int', unsigned: true })
  revisionNumber!: number;

  @Column({ type: 'varchar', length: 100 })
  trace!: string;

  /** Hz. */
  @Column({ type: 'double' })
  frequency!: number;

  @Column({ type: 'int', unsigned: true, nullable: true })
  createdById!: number | null;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  resolvedAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  resolvedById!: number | null;
}

/** One comment of a pin's thread (the first is the pin's own text), Markdown as written. */
@Entity({ name: 'pin_comments' })
export class PinComment {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  pinId!: number;

  @Column({ type: 'int', unsigned: true, nullable: true })
  authorId!: number | null;

  @Column({ type: 'text' })
  body!: string;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
