import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import { PartType } from '../catalog/part-type.entity.ts';
import { GainBinSchemeVersion } from '../catalog/gain-bin-scheme.entity.ts';
import { Supplier } from '../suppliers/supplier.entity.ts';
import { User } from '../users/user.entity.ts';

/** received → inspecting → awaiting-signature → accepted | rejected | mrb */
export type LotStatus = 'received' | 'inspecting' | 'awaiting-signature' | 'accepted' | 'rejected' | 'mrb';
export type DryBagState = 'sealed' | 'opened' | 'not-applicable';

@Entity({ name: 'lot' })
export class Lot {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  /** Our own code, e.g. L-20261201-0007 (shared/domain/labels makeLotCode). */
  @Column({ type: 'varchar', length: 30, unique: true })
  code: string;

  @Column({ name: 'supplier_id', type: 'integer' })
  supplierId: number;

  @ManyToOne(() => Supplier, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'supplier_id' })
  supplier?: Relation<Supplier>;

  @Column({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @ManyToOne(() => PartType, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'part_type_id' })
  partType?: Relation<PartType>;

  @Column({ type: 'integer' })
  quantity: number;

  @Column({ name: 'purchase_order', type: 'varchar', length: 60, nullable: true })
  purchaseOrder: string | null;

  @Column({ name: 'supplier_part_number', type: 'varchar', length: 60, nullable: true })
  supplierPartNumber: string | null;

  @Column({ name: 'supplier_lot', type: 'varchar', length: 60, nullable: true })
  supplierLot: string | null;

  @Column({ name: 'date_code', type: 'varchar', length: 20, nullable: true })
  dateCode: string | null;

  @Column({ name: 'country_of_origin', type: 'varchar', length: 2, nullable: true })
  countryOfOrigin: string | null;

  /** MSL as labelled on this lot (may differ from the part type's). */
  @Column({ type: 'varchar', length: 20, nullable: true })
  msl: string | null;

  @Column({ name: 'dry_bag', type: 'varchar', length: 20, default: 'not-applicable' })
  dryBag: DryBagState;

  @Column({ name: 'bag_opened_at', type: 'timestamptz', nullable: true })
  bagOpenedAt: Date | null;

  @Column({ type: 'varchar', length: 24, default: 'received' })
  status: LotStatus;

  /** The scanned supplier label as received (after separator normalisation). */
  @Column({ name: 'label_raw', type: 'text', nullable: true })
  labelRaw: string | null;

  /** SHA-256 of the normalised label text; a second scan of the same label is refused. */
  @Column({ name: 'label_fingerprint', type: 'varchar', length: 64, nullable: true, unique: true })
  labelFingerprint: string | null;

  /** Every data element of the label, the unknown ones included. */
  @Column({ name: 'label_elements', type: 'jsonb', nullable: true })
  labelElements: { di: string; value: string }[] | null;

  /** The gain-bin scheme version this lot is binned by (freezes that version). */
  @Column({ name: 'bin_scheme_id', type: 'integer', nullable: true })
  binSchemeId: number | null;

  @ManyToOne(() => GainBinSchemeVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'bin_scheme_id' })
  binScheme?: Relation<GainBinSchemeVersion>;

  @Column({ name: 'received_by', type: 'integer' })
  receivedBy: number;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'received_by' })
  receiver?: Relation<User>;

  @Column({ name: 'received_at', type: 'timestamptz', default: () => 'now()' })
  receivedAt: Date;

  /** Set when a quality engineer allowed receiving from a supplier that is not approved. */
  @Column({ name: 'override_by', type: 'integer', nullable: true })
  overrideBy: number | null;

  @Column({ name: 'override_reason', type: 'varchar', length: 500, nullable: true })
  overrideReason: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}

/** A file attached to a lot. Files are stored by id under the data folder and never replaced. */
@Entity({ name: 'lot_document' })
export class LotDocument {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @ManyToOne(() => Lot, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'lot_id' })
  lot?: Relation<Lot>;

  /** 'coc' | 'photo' | 'test-report' | 'other' */
  @Column({ type: 'varchar', length: 20 })
  kind: string;

  @Column({ name: 'original_name', type: 'varchar', length: 255 })
  originalName: string;

  /** Detected from the content, not the name. */
  @Column({ name: 'media_type', type: 'varchar', length: 60 })
  mediaType: string;

  @Column({ name: 'size_bytes', type: 'integer' })
  sizeBytes: number;

  @Column({ type: 'varchar', length: 64 })
  sha256: string;

  /** Path relative to the documents folder. */
  @Column({ name: 'storage_key', type: 'varchar', length: 200 })
  storageKey: string;

  @Column({ name: 'uploaded_by', type: 'integer' })
  uploadedBy: number;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'uploaded_by' })
  uploader?: Relation<User>;

  @Column({ name: 'uploaded_at', type: 'timestamptz', default: () => 'now()' })
  uploadedAt: Date;
}
