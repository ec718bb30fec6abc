import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { User } from '../users/user.entity.ts';
import { MeasurementSession } from './measurement-session.entity.ts';

/**
 * One reading of one part. `hfe` and `vbeMv` are as measured at the session's ambient
 * temperature; `hfe25` and `vbeMv25` are referred to 25 °C with the part type's coefficients.
 * Rows are never changed (a trigger refuses it); a correction is a new row with `supersedesId`,
 * and the old row only gets `superseded = true`.
 */
@Entity({ name: 'measurement' })
export class Measurement {
  /** bigserial: comes back from pg as a string. */
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  @Column({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @Column({ name: 'session_id', type: 'integer' })
  sessionId: number;

  @ManyToOne(() => MeasurementSession, { createForeignKeyConstraints: false })
  @JoinColumn({ name: 'session_id' })
  session?: Relation<MeasurementSession>;

  /** Part position in the lot (1-based). */
  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'double precision' })
  hfe: number;

  @Column({ name: 'vbe_mv', type: 'double precision' })
  vbeMv: number;

  @Column({ name: 'vce_sat_mv', type: 'double precision', nullable: true })
  vceSatMv: number | null;

  @Column({ name: 'leakage_na', type: 'double precision', nullable: true })
  leakageNa: number | null;

  @Column({ name: 'hfe_25', type: 'double precision' })
  hfe25: number;

  @Column({ name: 'vbe_mv_25', type: 'double precision' })
  vbeMv25: number;

  /** 'grid' (typed at the bench) or 'import' (tester CSV). */
  @Column({ type: 'varchar', length: 10, default: 'grid' })
  source: 'grid' | 'import';

  /** Data row number in the imported file (1 = first row after the header). */
  @Column({ name: 'source_row', type: 'integer', nullable: true })
  sourceRow: number | null;

  @Column({ name: 'supersedes_id', type: 'bigint', nullable: true })
  supersedesId: string | null;

  @Column({ type: 'boolean', default: false })
  superseded: boolean;

  @Column({ name: 'correction_reason', type: 'varchar', length: 300, nullable: true })
  correctionReason: string | null;

  @Column({ name: 'created_by', type: 'integer' })
  createdBy: number;

  @ManyToOne(() => User, { createForeignKeyConstraints: false })
  @JoinColumn({ name: 'created_by' })
  creator?: Relation<User>;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;
}
