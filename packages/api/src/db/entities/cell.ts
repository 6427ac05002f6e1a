import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

export type CellKind = 'circuit' | 'note';

/** A cell of a notebook; its text lives in its revisions, `revision` names the current one. */
@Entity({ name: 'cells' })
export class Cell {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'char', length: 12, charset: 'ascii', collation: 'ascii_bin' })
  notebookId!: string;

  @Column({ type: 'varchar', length: 10 })
  kind!: CellKind;

  /** The title its people chose, or null: then it is named by kind and place ("Circuit 2"). */
  @Column({ type: 'varchar', length: 80, nullable: true })
  title!: string | null;

  /** 0-based among the live cells; deleted cells keep the place they had. */
  @Column({ type: 'int', unsigned: true })
  position!: number;

  @Column({ type: 'int', unsigned: true })
  revision!: number;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @Column({ type: 'datetime', precision: 3 })
  updatedAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  deletedAt!: Date | null;
}
