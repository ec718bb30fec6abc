import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ContainerKind, ContainerStatus } from '../../../shared/domain/screening/index.ts';
import { GainBinRow, GainBinSchemeVersion } from '../catalog/gain-bin-scheme.entity.ts';
import { PartType } from '../catalog/part-type.entity.ts';
import { Lot } from '../lots/lot.entity.ts';
import { User } from '../users/user.entity.ts';

/**
 * A bag, tube, tray or foam strip holding the screened parts of one lot and one gain bin (or the
 * parts outside all bins: `gainBinId` and `binCode` null). With positions, each part keeps its
 * measurement (container_position); without, the container holds a count.
 */
@Entity({ name: 'container' })
export class Container {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  /** Our container code, e.g. C-20261201-0012 (shared/domain/labels makeContainerCode). */
  @Column({ type: 'varchar', length: 30, unique: true })
  code: string;

  @Column({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @ManyToOne(() => Lot, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'lot_id' })
  lot?: Relation<Lot>;

  @Column({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @ManyToOne(() => PartType, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'part_type_id' })
  partType?: Relation<PartType>;

  @Column({ name: 'bin_scheme_id', type: 'integer' })
  binSchemeId: number;

  @ManyToOne(() => GainBinSchemeVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'bin_scheme_id' })
  binScheme?: Relation<GainBinSchemeVersion>;

  @Column({ name: 'gain_bin_id', type: 'integer', nullable: true })
  gainBinId: number | null;

  @ManyToOne(() => GainBinRow, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'gain_bin_id' })
  gainBin?: Relation<GainBinRow>;

  @Column({ name: 'bin_code', type: 'varchar', length: 20, nullable: true })
  binCode: string | null;

  @Column({ type: 'varchar', length: 10 })
  kind: ContainerKind;

  @Column({ type: 'integer' })
  capacity: number;

  @Column({ name: 'has_positions', type: 'boolean' })
  hasPositions: boolean;

  /** Parts physically in the container (in stock or reserved); never below 0 nor above capacity. */
  @Column({ type: 'integer', default: 0 })
  quantity: number;

  @Column({ type: 'varchar', length: 60 })
  location: string;

  @Column({ type: 'varchar', length: 10, default: 'open' })
  status: ContainerStatus;

  /** Rises with every change; clients may send it back to refuse a stale edit. */
  @Column({ type: 'integer', default: 1 })
  version: number;

  @Column({ name: 'created_by', type: 'integer' })
  createdBy: number;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'created_by' })
  creator?: Relation<User>;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt: Date;
}
