import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { DispositionDecision, MrbAction, Recommendation } from '../../../shared/api/disposition.ts';

/**
 * The disposition of a lot: the product's recommendation, the inspector's proposal and the
 * quality engineer's signed decision. Once signed the row is locked (trigger in the migration).
 */
@Entity({ name: 'disposition' })
export class Disposition {
  @PrimaryColumn({ name: 'lot_id', type: 'integer' })
  lotId: number;

  @Column({ type: 'varchar', length: 12 })
  recommended: Recommendation['decision'];

  /** The recommendation with the plan it came from, as it stood when proposed or signed. */
  @Column({ type: 'jsonb' })
  recommendation: Recommendation;

  @Column({ name: 'proposed_decision', type: 'varchar', length: 10 })
  proposedDecision: DispositionDecision;

  @Column({ name: 'proposed_mrb_action', type: 'varchar', length: 20, nullable: true })
  proposedMrbAction: MrbAction | null;

  @Column({ name: 'proposed_by', type: 'integer' })
  proposedBy: number;

  @Column({ name: 'proposed_at', type: 'timestamptz', default: () => 'now()' })
  proposedAt: Date;

  @Column({ name: 'proposal_reason', type: 'varchar', length: 1000 })
  proposalReason: string;

  @Column({ type: 'varchar', length: 10, nullable: true })
  decision: DispositionDecision | null;

  @Column({ name: 'mrb_action', type: 'varchar', length: 20, nullable: true })
  mrbAction: MrbAction | null;

  @Column({ type: 'varchar', length: 1000, nullable: true })
  reason: string | null;

  @Column({ name: 'signed_by', type: 'integer', nullable: true })
  signedBy: number | null;

  @Column({ name: 'signed_at', type: 'timestamptz', nullable: true })
  signedAt: Date | null;
}
