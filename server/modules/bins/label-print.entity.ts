import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One bin label printed (or reprinted) for a container, with the Data Matrix payload it carried. */
@Entity({ name: 'label_print' })
export class LabelPrint {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  @Column({ name: 'job_id', type: 'uuid' })
  jobId: string;

  @Column({ name: 'container_id', type: 'integer' })
  containerId: number;

  @Column({ type: 'varchar', length: 20 })
  stock: string;

  @Column({ type: 'integer' })
  page: number;

  @Column({ type: 'integer' })
  cell: number;

  @Column({ type: 'boolean' })
  reprint: boolean;

  @Column({ type: 'integer' })
  quantity: number;

  @Column({ type: 'text' })
  payload: string;

  @Column({ name: 'printed_by', type: 'integer' })
  printedBy: number;

  @Column({ name: 'printed_at', type: 'timestamptz', default: () => 'now()' })
  printedAt: Date;
}
