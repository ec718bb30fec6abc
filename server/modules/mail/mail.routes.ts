import { Router, type Response } from 'express';
import type { Transporter } from 'nodemailer';
import type { DataSource } from 'typeorm';
import type { ServerConfig } from '../../config.ts';
import { AppError } from '../../http/app-error.ts';
import { requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { deliverDueMail, getOutboxAttachment, listOutbox, retryMail } from './mail.service.ts';
import { listSinkMessages, sinkAttachment } from './sink-reader.ts';

const STATUSES = ['queued', 'sent', 'failed'];

function idParam(value: string, field: string): number {
  const id = Number(value);
  if (!Number.isInteger(id) || id < 1) throw AppError.badRequest(`${field} must be a positive whole number.`, [{ field, message: 'invalid id' }]);
  return id;
}

function sendFile(res: Response, file: { filename: string; contentType: string; content: Buffer }) {
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', `attachment; filename="${file.filename.replace(/[^\w.-]/g, '_')}"`);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.send(file.content);
}

/** Outgoing mail and the local sink's inbox: quality engineers only. */
export function mailRouter(ds: DataSource, config: ServerConfig, transport: Transporter): Router {
  const r = Router();
  r.use(requireRole('quality'));

  r.get('/outbox', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const status = typeof req.query.status === 'string' && req.query.status ? req.query.status : undefined;
    if (status && !STATUSES.includes(status)) throw AppError.badRequest('Unknown status.', [{ field: 'status', message: `status must be one of ${STATUSES.join(', ')}` }]);
    res.json(await listOutbox(ds, { page, pageSize, status }));
  });

  r.get('/outbox/:id/attachments/:attachmentId', async (req, res) => {
    const a = await getOutboxAttachment(ds, idParam(req.params.id, 'id'), idParam(req.params.attachmentId, 'attachmentId'));
    sendFile(res, a);
  });

  r.post('/outbox/:id/retry', async (req, res) => {
    await retryMail(ds, idParam(req.params.id, 'id'));
    const result = await deliverDueMail(ds, transport, config.smtp.from);
    res.json(result);
  });

  r.get('/sink', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query, 20);
    res.json(await listSinkMessages(config.smtp.sinkFolder, { page, pageSize }));
  });

  r.get('/sink/:name/attachments/:index', async (req, res) => {
    const index = Number(req.params.index);
    if (!Number.isInteger(index) || index < 0) throw AppError.badRequest('index must be a whole number ≥ 0.', [{ field: 'index', message: 'invalid index' }]);
    sendFile(res, await sinkAttachment(config.smtp.sinkFolder, req.params.name, index));
  });

  return r;
}
