import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

/** A part type of our catalog: test conditions, limits, coefficients, defaults. Units in column names. */
@Entity({ name: 'part_type' })
export class PartType {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'part_number', type: 'varchar', length: 60, unique: true })
  partNumber: string;

  @Column({ type: 'varchar', length: 200 })
  description: string;

  @Column({ type: 'varchar', length: 3 })
  polarity: 'NPN' | 'PNP';

  @Column({ name: 'package', type: 'varchar', length: 40 })
  packageName: string;

  @Column({ name: 'hfe_ic_ma', type: 'double precision' })
  hfeIcMa: number;

  @Column({ name: 'hfe_vce_v', type: 'double precision' })
  hfeVceV: number;

  @Column({ name: 'vbe_ic_ma', type: 'double precision' })
  vbeIcMa: number;

  @Column({ name: 'hfe_min', type: 'double precision', nullable: true })
  hfeMin: number | null;

  @Column({ name: 'hfe_max', type: 'double precision', nullable: true })
  hfeMax: number | null;

  @Column({ name: 'vbe_min_mv', type: 'double precision', nullable: true })
  vbeMinMv: number | null;

  @Column({ name: 'vbe_max_mv', type: 'double precision', nullable: true })
  vbeMaxMv: number | null;

  @Column({ name: 'vbe_tc_mv_per_c', type: 'double precision', default: -2 })
  vbeTcMvPerC: number;

  @Column({ name: 'hfe_tc_pct_per_c', type: 'double precision', default: 0.5 })
  hfeTcPctPerC: number;

  /** J-STD-020 level ('1','2','2a','3','4','5','5a','6') or 'not-classified'. */
  @Column({ type: 'varchar', length: 20 })
  msl: string;

  /** ANSI/ESDA/JEDEC JS-001 HBM class code, e.g. '1B'; null when unknown. */
  @Column({ name: 'esd_hbm_class', type: 'varchar', length: 4, nullable: true })
  esdHbmClass: string | null;

  /** 'attribute' (ISO 2859-1), 'zero-acceptance' (c = 0) or 'variables' (ISO 3951-1 s-method on hFE). */
  @Column({ name: 'sampling_method', type: 'varchar', length: 20, default: 'attribute' })
  samplingMethod: 'attribute' | 'zero-acceptance' | 'variables';

  @Column({ name: 'inspection_level', type: 'varchar', length: 4, default: 'II' })
  inspectionLevel: string;

  @Column({ type: 'double precision', default: 1.0 })
  aql: number;

  @Column({ name: 'match_hfe_pct', type: 'double precision', default: 5 })
  matchHfePct: number;

  @Column({ name: 'match_vbe_mv', type: 'double precision', default: 2 })
  matchVbeMv: number;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
