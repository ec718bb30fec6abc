export type MailStatus = 'queued' | 'sent' | 'failed';

export interface OutboxRow {
  id: number;
  to: string;
  subject: string;
  status: MailStatus;
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string;
  sentAt: string | null;
  createdAt: string;
  relatedType: string | null;
  relatedId: string | null;
  attachments: { id: number; filename: string; contentType: string; size: number }[];
}

export interface SinkMessage {
  name: string;
  from: string;
  to: string;
  subject: string;
  date: string | null;
  text: string;
  attachments: { index: number; filename: string; contentType: string; size: number }[];
}
