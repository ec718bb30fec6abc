import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { NcrStatus } from '../../../shared/api/supplier-quality.ts';

/** A nonconformance report to a supplier: open → sent → answered → closed. */
@Entity({ name: 'ncr' })
export class Ncr {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  /** NCR-YYYY-NNNN, numbered per calendar year (UTC). */
  @Column({ type: 'varchar', length: 20, unique: true })
  code: string;

  @Column({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @Column({ name: 'alert_id', type: 'integer', nullable: true })
  alertId: number | null;

  @Column({ name: 'supplier_id', type: 'integer' })
  supplierId: number;

  @Column({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @Column({ type: 'text' })
  findings: string;

  @Column({ type: 'varchar', length: 1000 })
  disposition: string;

  @Column({ name: 'corrective_action', type: 'varchar', length: 2000 })
  correctiveAction: string;

  /** Calendar date YYYY-MM-DD (pg `date` comes back as a string). */
  @Column({ name: 'due_date', type: 'date' })
  dueDate: string;

  @Column({ type: 'varchar', length: 10, default: 'open' })
  status: NcrStatus;

  @Column({ name: 'sent_at', type: 'timestamptz', nullable: true })
  sentAt: Date | null;

  @Column({ name: 'sent_to', type: 'varchar', length: 254, nullable: true })
  sentTo: string | null;

  @Column({ name: 'mail_id', type: 'integer', nullable: true })
  mailId: number | null;

  @Column({ name: 'answer_text', type: 'text', nullable: true })
  answerText: string | null;

  @Column({ name: 'answer_doc_name', type: 'varchar', length: 255, nullable: true })
  answerDocName: string | null;

  @Column({ name: 'answer_doc_media_type', type: 'varchar', length: 60, nullable: true })
  answerDocMediaType: string | null;

  @Column({ name: 'answer_doc_size', type: 'integer', nullable: true })
  answerDocSize: number | null;

  @Column({ name: 'answer_doc_sha256', type: 'varchar', length: 64, nullable: true })
  answerDocSha256: string | null;

  /** Path of the stored answer document relative to `<dataDir>/ncr-answers`. */
  @Column({ name: 'answer_doc_key', type: 'varchar', length: 200, nullable: true })
  answerDocKey: string | null;

  @Column({ name: 'answered_at', type: 'timestamptz', nullable: true })
  answeredAt: Date | null;

  @Column({ name: 'answered_by', type: 'integer', nullable: true })
  answeredBy: number | null;

  @Column({ name: 'closed_at', type: 'timestamptz', nullable: true })
  closedAt: Date | null;

  @Column({ name: 'closed_by', type: 'integer', nullable: true })
  closedBy: number | null;

  @Column({ name: 'close_note', type: 'varchar', length: 1000, nullable: true })
  closeNote: string | null;

  @Column({ name: 'created_by', type: 'integer' })
  createdBy: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
