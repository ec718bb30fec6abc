import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import { PartType } from '../catalog/part-type.entity.ts';

export type ApprovalStatus = 'approved' | 'conditional' | 'not-approved';

@Entity({ name: 'supplier' })
export class Supplier {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ type: 'varchar', length: 20, unique: true })
  code: string;

  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'varchar', length: 20, default: 'approved' })
  approval: ApprovalStatus;

  @Column({ type: 'varchar', length: 1000, nullable: true })
  notes: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @OneToMany(() => SupplierContact, (c) => c.supplier)
  contacts?: Relation<SupplierContact[]>;

  @OneToMany(() => SupplierPart, (p) => p.supplier)
  parts?: Relation<SupplierPart[]>;
}

@Entity({ name: 'supplier_contact' })
export class SupplierContact {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'supplier_id', type: 'integer' })
  supplierId: number;

  @ManyToOne(() => Supplier, (s) => s.contacts, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'supplier_id' })
  supplier?: Relation<Supplier>;

  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'varchar', length: 254 })
  email: string;

  @Column({ type: 'varchar', length: 40, nullable: true })
  phone: string | null;

  /** What the contact handles, e.g. 'quality', 'sales'. */
  @Column({ type: 'varchar', length: 40, nullable: true })
  duty: string | null;
}

/** A supplier's part number mapped to our part type. */
@Entity({ name: 'supplier_part' })
export class SupplierPart {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'supplier_id', type: 'integer' })
  supplierId: number;

  @ManyToOne(() => Supplier, (s) => s.parts, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'supplier_id' })
  supplier?: Relation<Supplier>;

  @Column({ name: 'supplier_part_number', type: 'varchar', length: 60 })
  supplierPartNumber: string;

  @Column({ name: 'part_type_id', type: 'integer' })
  partTypeId: number;

  @ManyToOne(() => PartType, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'part_type_id' })
  partType?: Relation<PartType>;
}
