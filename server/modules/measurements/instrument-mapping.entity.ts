import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { ImportMapping, ImportUnits } from '../../../shared/api/measurements.ts';

/** The CSV column mapping and units last used with an instrument, offered again next time. */
@Entity({ name: 'instrument_mapping' })
export class InstrumentMapping {
  @PrimaryColumn({ type: 'varchar', length: 80 })
  instrument: string;

  @Column({ type: 'jsonb' })
  mapping: ImportMapping;

  @Column({ type: 'jsonb' })
  units: ImportUnits;

  @Column({ name: 'updated_by', type: 'integer', nullable: true })
  updatedBy: number | null;

  @Column({ name: 'updated_at', type: 'timestamptz', default: () => 'now()' })
  updatedAt: Date;
}
