import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { PartType } from './part-type.entity.ts';

/**
 * One version of a part type's gain-bin scheme. Once a lot has used a version it is frozen
 * (`lockedAt` set); an edit then creates the next version.
 */
@Entity({ name: 'gain_bin_scheme' })
export class GainBinSchemeVersion {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @ManyToOne(() => PartType, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'part_type_id' })
  partType?: Relation<PartType>;

  @Column({ type: 'integer' })
  version: number;

  @Column({ type: 'varchar', length: 300, nullable: true })
  note: string | null;

  @Column({ name: 'locked_at', type: 'timestamptz', nullable: true })
  lockedAt: Date | null;

  @Column({ name: 'created_by', type: 'integer', nullable: true })
  createdBy: number | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @OneToMany(() => GainBinRow, (b) => b.scheme, { cascade: ['insert'] })
  bins?: Relation<GainBinRow[]>;
}

/** One hFE interval of a scheme version; [hfeMin, hfeMax), the last one closed (shared/domain/binning). */
@Entity({ name: 'gain_bin' })
export class GainBinRow {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'scheme_id', type: 'integer' })
  schemeId: number;

  @ManyToOne(() => GainBinSchemeVersion, (s) => s.bins, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'scheme_id' })
  scheme?: Relation<GainBinSchemeVersion>;

  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'varchar', length: 20 })
  code: string;

  @Column({ type: 'varchar', length: 80 })
  label: string;

  @Column({ name: 'hfe_min', type: 'double precision' })
  hfeMin: number;

  @Column({ name: 'hfe_max', type: 'double precision' })
  hfeMax: number;

  @Column({ name: 'vbe_min_mv', type: 'double precision', nullable: true })
  vbeMinMv: number | null;

  @Column({ name: 'vbe_max_mv', type: 'double precision', nullable: true })
  vbeMaxMv: number | null;

  @Column({ name: 'gap_before_intended', type: 'boolean', default: false })
  gapBeforeIntended: boolean;
}
