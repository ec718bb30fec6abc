import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { PositionState } from '../../../shared/api/bins.ts';
import { Measurement } from '../measurements/measurement.entity.ts';
import { Container } from './container.entity.ts';

/**
 * One numbered place of a positioned container holding one measured part. A place is occupied
 * while the state is in-stock or reserved; pulled, scrapped and rebinned rows stay as history.
 */
@Entity({ name: 'container_position' })
export class ContainerPosition {
  /** bigserial: comes back from pg as a string. */
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  @Column({ name: 'container_id', type: 'integer' })
  containerId: number;

  @ManyToOne(() => Container, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'container_id' })
  container?: Relation<Container>;

  @Column({ type: 'integer' })
  position: number;

  @Column({ name: 'measurement_id', type: 'bigint', unique: true })
  measurementId: string;

  @ManyToOne(() => Measurement, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'measurement_id' })
  measurement?: Relation<Measurement>;

  @Column({ type: 'varchar', length: 10, default: 'in-stock' })
  state: PositionState;

  @Column({ name: 'placed_at', type: 'timestamptz', default: () => 'now()' })
  placedAt: Date;

  @Column({ name: 'state_changed_at', type: 'timestamptz', default: () => 'now()' })
  stateChangedAt: Date;
}
