import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { MovementKind } from '../../../shared/api/bins.ts';

/** The stock ledger: one row per change of a container. Append-only (trigger in the migration). */
@Entity({ name: 'stock_movement' })
export class StockMovement {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  @Column({ name: 'container_id', type: 'integer' })
  containerId: number;

  @Column({ type: 'varchar', length: 10 })
  kind: MovementKind;

  @Column({ name: 'quantity_delta', type: 'integer' })
  quantityDelta: number;

  @Column({ name: 'quantity_after', type: 'integer' })
  quantityAfter: number;

  @Column({ name: 'from_location', type: 'varchar', length: 60, nullable: true })
  fromLocation: string | null;

  @Column({ name: 'to_location', type: 'varchar', length: 60, nullable: true })
  toLocation: string | null;

  @Column({ type: 'integer', array: true, nullable: true })
  positions: number[] | null;

  @Column({ name: 'measurement_id', type: 'bigint', nullable: true })
  measurementId: string | null;

  @Column({ type: 'varchar', length: 300, nullable: true })
  reason: string | null;

  @Column({ name: 'user_id', type: 'integer', nullable: true })
  userId: number | null;

  @Column({ type: 'timestamptz', default: () => 'now()' })
  at: Date;
}
