import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One site-wide setting per key, its value as JSON (e.g. key 'scanner'). */
@Entity({ name: 'site_setting' })
export class SiteSetting {
  @PrimaryColumn({ type: 'varchar', length: 60 })
  key: string;

  @Column({ type: 'jsonb' })
  value: Record<string, unknown>;

  @Column({ name: 'updated_by', type: 'integer', nullable: true })
  updatedBy: number | null;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt: Date;
}
