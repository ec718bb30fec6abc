import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One row per change. The table refuses UPDATE and DELETE (trigger in the migration). */
@Entity({ name: 'audit_entry' })
export class AuditEntry {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  @Column({ type: 'timestamptz', default: () => 'now()' })
  at: Date;

  @Column({ name: 'actor_id', type: 'integer', nullable: true })
  actorId: number | null;

  @Column({ name: 'actor_name', type: 'varchar', length: 120 })
  actorName: string;

  @Column({ type: 'varchar', length: 60 })
  action: string;

  @Column({ name: 'entity_type', type: 'varchar', length: 60 })
  entityType: string;

  @Column({ name: 'entity_id', type: 'varchar', length: 80 })
  entityId: string;

  @Column({ type: 'jsonb', nullable: true })
  before: Record<string, unknown> | null;

  @Column({ type: 'jsonb', nullable: true })
  after: Record<string, unknown> | null;

  @Column({ type: 'varchar', length: 500, nullable: true })
  note: string | null;
}
