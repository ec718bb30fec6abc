import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { SwitchingState } from '../../../shared/domain/sampling/index.ts';

/** Where a supplier and part type stand in the ISO 2859-1 switching scheme. */
@Entity({ name: 'switching_state' })
export class SwitchingStateRow {
  @PrimaryColumn({ name: 'supplier_id', type: 'integer' })
  supplierId: number;

  @PrimaryColumn({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @Column({ type: 'jsonb' })
  state: SwitchingState;

  /** Why the current severity applies, in words. */
  @Column({ type: 'varchar', length: 500 })
  reason: string;

  /** The responsible authority approves reduced inspection (set by a quality engineer). */
  @Column({ name: 'reduced_approved', type: 'boolean', default: false })
  reducedApproved: boolean;

  @Column({ name: 'production_steady', type: 'boolean', default: true })
  productionSteady: boolean;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt: Date;
}
