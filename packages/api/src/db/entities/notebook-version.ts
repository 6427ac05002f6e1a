import { Column, Entity, PrimaryColumn, PrimaryGeneratedColumn } from 'typeorm';

/** A labelled snapshot of a notebook: the current revision of every live cell at that moment. */
@Entity({ name: 'notebook_versions' })
export class NotebookVersion {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin' })
  notebookId!: string;

  @Column({ type: 'int', unsigned: true })
  number!: number;

  @Column({ type: 'varchar', length: 200 })
  label!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  authorId!: number | null;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}

/** One cell of a version: which revision it had, and where it stood. */
@Entity({ name: 'notebook_version_cells' })
export class NotebookVersionCell {
  @PrimaryColumn({ type: 'int', unsigned: true })
  versionId!: number;

  @PrimaryColumn({ type: 'int', unsigned: true })
  cellId!: number;

  @Column({ type: 'int', unsigned: true })
  revisionId!: number;

  @Column({ type: 'int', unsigned: true })
  position!: number;
}
