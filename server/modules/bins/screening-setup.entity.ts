import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { ContainerKind } from '../../../shared/domain/screening/index.ts';

/** How screening opens new containers for one lot (DEFAULT_SCREENING_SETUP when absent). */
@Entity({ name: 'screening_setup' })
export class ScreeningSetupRow {
  @PrimaryColumn({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @Column({ type: 'varchar', length: 10 })
  kind: ContainerKind;

  @Column({ type: 'integer' })
  capacity: number;

  @Column({ name: 'has_positions', type: 'boolean' })
  hasPositions: boolean;

  @Column({ type: 'varchar', length: 60 })
  location: string;

  @Column({ name: 'updated_by', type: 'integer', nullable: true })
  updatedBy: number | null;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt: Date;
}
