import { Column, Entity, PrimaryColumn, PrimaryGeneratedColumn } from 'typeorm';
import type { DriftFigures, DriftFlag, DriftResult } from '../../../shared/domain/drift/index.ts';

/** The drift check of one disposed lot, made once (the row marks it done) with its full result. */
@Entity({ name: 'drift_check' })
export class DriftCheck {
  @PrimaryColumn({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @Column({ name: 'checked_at', type: 'timestamptz', default: () => 'now()' })
  checkedAt: Date;

  @Column({ type: 'boolean' })
  alert: boolean;

  /** The comparison, or why none was made (a lot without sample readings). */
  @Column({ type: 'jsonb' })
  result: DriftResult | { skipped: string };
}

export type DriftAlertStatus = 'open' | 'acknowledged';

/** A lot whose gain distribution stood out from the supplier's accepted history. */
@Entity({ name: 'drift_alert' })
export class DriftAlert {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'lot_id', type: 'integer', unique: true })
  lotId: number;

  @Column({ name: 'supplier_id', type: 'integer' })
  supplierId: number;

  @Column({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @Column({ type: 'jsonb' })
  figures: DriftFigures;

  @Column({ type: 'jsonb' })
  flags: DriftFlag[];

  @Column({ type: 'text' })
  explanation: string;

  @Column({ name: 'suggested_checks', type: 'jsonb' })
  suggestedChecks: string[];

  @Column({ type: 'varchar', length: 12, default: 'open' })
  status: DriftAlertStatus;

  @Column({ name: 'raised_at', type: 'timestamptz', default: () => 'now()' })
  raisedAt: Date;

  @Column({ name: 'acknowledged_by', type: 'integer', nullable: true })
  acknowledgedBy: number | null;

  @Column({ name: 'acknowledged_at', type: 'timestamptz', nullable: true })
  acknowledgedAt: Date | null;

  @Column({ name: 'acknowledge_note', type: 'varchar', length: 1000, nullable: true })
  acknowledgeNote: string | null;
}
