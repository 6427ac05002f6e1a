import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One immutable saved text of a cell. Rows are inserted, never updated. */
@Entity({ name: 'cell_revisions' })
export class CellRevision {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  cellId!: number;

  @Column({ type: 'int', unsigned: true })
  number!: number;

  @Column({ type: 'mediumtext' })
  text!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  authorId!: number | null;

  /** Why the revision was made when its author did not type it (`language update`); null for a save. */
  @Column({ type: 'varchar', length: 200, nullable: true })
  message!: string | null;

  /** The solver's error and warning counts for a circuit cell's text; null for notes. */
  @Column({ type: 'int', unsigned: true, nullable: true })
  diagnosticErrors!: number | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  diagnosticWarnings!: number | null;

  @Column({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
