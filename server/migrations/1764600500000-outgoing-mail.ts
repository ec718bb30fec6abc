import type { MigrationInterface, QueryRunner } from 'typeorm';

export class OutgoingMail1764600500000 implements MigrationInterface {
  name = 'OutgoingMail1764600500000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE outgoing_mail (
        id serial PRIMARY KEY,
        to_address varchar(500) NOT NULL,
        subject varchar(300) NOT NULL,
        body_text text NOT NULL,
        status varchar(10) NOT NULL DEFAULT 'queued' CHECK (status IN ('queued','sent','failed')),
        attempts integer NOT NULL DEFAULT 0,
        last_error varchar(1000),
        next_attempt_at timestamptz NOT NULL DEFAULT now(),
        sent_at timestamptz,
        message_id varchar(300),
        related_type varchar(40),
        related_id varchar(40),
        created_by integer REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX outgoing_mail_due_idx ON outgoing_mail (next_attempt_at) WHERE status <> 'sent'`);
    await q.query(`
      CREATE TABLE outgoing_mail_attachment (
        id serial PRIMARY KEY,
        mail_id integer NOT NULL REFERENCES outgoing_mail(id) ON DELETE CASCADE,
        filename varchar(255) NOT NULL,
        content_type varchar(100) NOT NULL,
        content bytea NOT NULL
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE outgoing_mail_attachment`);
    await q.query(`DROP TABLE outgoing_mail`);
  }
}
