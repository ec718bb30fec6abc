import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Lot } from '../lots/lot.entity.ts';
import { User } from '../users/user.entity.ts';

export type SessionMode = 'sample' | 'screen';

/** One sitting at the bench on a lot: which instrument, at what ambient temperature, by whom. */
@Entity({ name: 'measurement_session' })
export class MeasurementSession {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @ManyToOne(() => Lot, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'lot_id' })
  lot?: Relation<Lot>;

  @Column({ type: 'varchar', length: 80 })
  instrument: string;

  /** Ambient temperature at the bench, °C; the readings are referred to 25 °C from it. */
  @Column({ name: 'ambient_c', type: 'double precision' })
  ambientC: number;

  @Column({ name: 'operator_id', type: 'integer' })
  operatorId: number;

  @ManyToOne(() => User)
  @JoinColumn({ name: 'operator_id' })
  operator?: Relation<User>;

  /** 'sample' (the plan's sample) or 'screen' (100 % screening). */
  @Column({ type: 'varchar', length: 10 })
  mode: SessionMode;

  @Column({ name: 'started_at', type: 'timestamptz', default: () => 'now()' })
  startedAt: Date;

  @Column({ name: 'closed_at', type: 'timestamptz', nullable: true })
  closedAt: Date | null;
}
