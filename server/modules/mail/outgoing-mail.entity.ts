import { Column, Entity, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';

export type MailStatus = 'queued' | 'sent' | 'failed';

/**
 * A message Binwright sends. It is stored before any delivery attempt, so a failed send is
 * kept, shown and retried — never lost.
 */
@Entity({ name: 'outgoing_mail' })
export class OutgoingMail {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'to_address', type: 'varchar', length: 500 })
  to: string;

  @Column({ type: 'varchar', length: 300 })
  subject: string;

  @Column({ name: 'body_text', type: 'text' })
  bodyText: string;

  @Column({ type: 'varchar', length: 10, default: 'queued' })
  status: MailStatus;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ name: 'last_error', type: 'varchar', length: 1000, nullable: true })
  lastError: string | null;

  @Column({ name: 'next_attempt_at', type: 'timestamptz', default: () => 'now()' })
  nextAttemptAt: Date;

  @Column({ name: 'sent_at', type: 'timestamptz', nullable: true })
  sentAt: Date | null;

  @Column({ name: 'message_id', type: 'varchar', length: 300, nullable: true })
  messageId: string | null;

  /** What the message is about, e.g. 'ncr' and its id. */
  @Column({ name: 'related_type', type: 'varchar', length: 40, nullable: true })
  relatedType: string | null;

  @Column({ name: 'related_id', type: 'varchar', length: 40, nullable: true })
  relatedId: string | null;

  @Column({ name: 'created_by', type: 'integer', nullable: true })
  createdBy: number | null;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;

  @OneToMany(() => OutgoingMailAttachment, (a) => a.mail)
  attachments?: Relation<OutgoingMailAttachment[]>;
}

@Entity({ name: 'outgoing_mail_attachment' })
export class OutgoingMailAttachment {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id: number;

  @Column({ name: 'mail_id', type: 'integer' })
  mailId: number;

  @ManyToOne(() => OutgoingMail, (m) => m.attachments, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'mail_id' })
  mail?: Relation<OutgoingMail>;

  @Column({ type: 'varchar', length: 255 })
  filename: string;

  @Column({ name: 'content_type', type: 'varchar', length: 100 })
  contentType: string;

  @Column({ type: 'bytea' })
  content: Buffer;
}
