import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { KitStatus, MatchMode } from '../../../shared/api/pairing.ts';
import { ContainerPosition } from '../bins/container-position.entity.ts';
import { Container } from '../bins/container.entity.ts';
import { PartType } from '../catalog/part-type.entity.ts';
import { Lot } from '../lots/lot.entity.ts';
import { Measurement } from '../measurements/measurement.entity.ts';
import { User } from '../users/user.entity.ts';

/** A request for matched sets and, once reserved, the kit that holds them. */
@Entity({ name: 'kit_request' })
export class KitRequest {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  /** KIT-YYYYMMDD-NNNN (shared/domain/kitting makeKitCode). */
  @Column({ type: 'varchar', length: 30, unique: true })
  code: string;

  @Column({ type: 'varchar', length: 15 })
  mode: MatchMode;

  @Column({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @ManyToOne(() => PartType, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'part_type_id' })
  partType?: Relation<PartType>;

  /** The opposite-polarity part type of a complementary kit; null otherwise. */
  @Column({ name: 'complement_part_type_id', type: 'integer', nullable: true })
  complementPartTypeId: number | null;

  @ManyToOne(() => PartType, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'complement_part_type_id' })
  complementPartType?: Relation<PartType>;

  @Column({ name: 'set_size', type: 'integer' })
  setSize: number;

  @Column({ name: 'sets_wanted', type: 'integer' })
  setsWanted: number;

  /** t in |h1 − h2| / min(h1, h2) ≤ t, percent. */
  @Column({ name: 'hfe_tolerance_pct', type: 'double precision' })
  hfeTolerancePct: number;

  @Column({ name: 'vbe_tolerance_mv', type: 'double precision' })
  vbeToleranceMv: number;

  @Column({ type: 'varchar', length: 10, default: 'reserved' })
  status: KitStatus;

  @Column({ name: 'reserved_until', type: 'timestamptz', nullable: true })
  reservedUntil: Date | null;

  @Column({ type: 'varchar', length: 300, nullable: true })
  note: string | null;

  @Column({ name: 'created_by', type: 'integer' })
  createdBy: number;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'created_by' })
  creator?: Relation<User>;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt: Date;

  @Column({ name: 'completed_at', type: 'timestamptz', nullable: true })
  completedAt: Date | null;

  @Column({ name: 'expired_at', type: 'timestamptz', nullable: true })
  expiredAt: Date | null;

  @Column({ name: 'cancelled_at', type: 'timestamptz', nullable: true })
  cancelledAt: Date | null;

  @Column({ name: 'cancelled_by', type: 'integer', nullable: true })
  cancelledBy: number | null;
}

/** One matched set of a kit with its mismatch figures (what they mean: shared/api/pairing MismatchMeaning). */
@Entity({ name: 'kit_set' })
export class KitSet {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'kit_id', type: 'integer' })
  kitId: number;

  @ManyToOne(() => KitRequest, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'kit_id' })
  kit?: Relation<KitRequest>;

  /** 1-based, in order of increasing mismatch. */
  @Column({ name: 'set_index', type: 'integer' })
  setIndex: number;

  @Column({ name: 'hfe_spread_pct', type: 'double precision' })
  hfeSpreadPct: number;

  @Column({ name: 'vbe_spread_mv', type: 'double precision' })
  vbeSpreadMv: number;

  @Column({ type: 'double precision' })
  mismatch: number;

  @Column({ name: 'mirror_ratio', type: 'double precision' })
  mirrorRatio: number;

  @Column({ name: 'offset_mv', type: 'double precision' })
  offsetMv: number;

  @Column({ name: 'hfe_ratio', type: 'double precision' })
  hfeRatio: number;
}

/**
 * One part of a kit: reserved in a container position, then pulled (pulled_at/by) or given back
 * (released_at). The container, measurement and lot stay on the row for traceability.
 */
@Entity({ name: 'kit_part' })
export class KitPart {
  /** bigserial: comes back from pg as a string. */
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  @Column({ name: 'kit_id', type: 'integer' })
  kitId: number;

  @ManyToOne(() => KitRequest, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'kit_id' })
  kit?: Relation<KitRequest>;

  @Column({ name: 'kit_set_id', type: 'integer' })
  kitSetId: number;

  @ManyToOne(() => KitSet, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'kit_set_id' })
  kitSet?: Relation<KitSet>;

  @Column({ name: 'container_position_id', type: 'bigint' })
  containerPositionId: string;

  @ManyToOne(() => ContainerPosition, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'container_position_id' })
  containerPosition?: Relation<ContainerPosition>;

  @Column({ name: 'container_id', type: 'integer' })
  containerId: number;

  @ManyToOne(() => Container, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'container_id' })
  container?: Relation<Container>;

  @Column({ type: 'integer' })
  position: number;

  @Column({ name: 'measurement_id', type: 'bigint' })
  measurementId: string;

  @ManyToOne(() => Measurement, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'measurement_id' })
  measurement?: Relation<Measurement>;

  @Column({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @ManyToOne(() => Lot, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'lot_id' })
  lot?: Relation<Lot>;

  @Column({ name: 'pulled_at', type: 'timestamptz', nullable: true })
  pulledAt: Date | null;

  @Column({ name: 'pulled_by', type: 'integer', nullable: true })
  pulledBy: number | null;

  @Column({ name: 'released_at', type: 'timestamptz', nullable: true })
  releasedAt: Date | null;
}
