import fs from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import type { SinkMessage } from '../../../shared/api/mail.ts';
import type { Page } from '../../../shared/api/page.ts';
import { AppError } from '../../http/app-error.ts';

const NAME = /^[\w.-]+\.eml$/;

function addresses(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

async function read(folder: string, name: string) {
  if (!NAME.test(name)) throw AppError.badRequest('Not a message name.', [{ field: 'name', message: 'invalid message name' }]);
  try {
    return await simpleParser(await fs.readFile(path.join(folder, name)));
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') throw AppError.notFound(`Message ${name}`);
    throw e;
  }
}

/** Messages the local SMTP sink received, newest first, parsed with mailparser. */
export async function listSinkMessages(folder: string, q: { page: number; pageSize: number }): Promise<Page<SinkMessage>> {
  let names: string[] = [];
  try {
    names = (await fs.readdir(folder)).filter((n) => NAME.test(n)).sort().reverse();
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw e;
  }
  const slice = names.slice((q.page - 1) * q.pageSize, q.page * q.pageSize);
  const items: SinkMessage[] = [];
  for (const name of slice) {
    const m = await read(folder, name);
    items.push({
      name,
      from: addresses(m.from),
      to: addresses(m.to),
      subject: m.subject ?? '',
      date: m.date?.toISOString() ?? null,
      text: (m.text ?? '').slice(0, 4000),
      attachments: m.attachments.map((a, index) => ({ index, filename: a.filename ?? `attachment-${index + 1}`, contentType: a.contentType, size: a.size })),
    });
  }
  return { items, total: names.length, page: q.page, pageSize: q.pageSize };
}

export async function sinkAttachment(folder: string, name: string, index: number) {
  const m = await read(folder, name);
  const a = m.attachments[index];
  if (!a) throw AppError.notFound('Attachment');
  return { filename: a.filename ?? `attachment-${index + 1}`, contentType: a.contentType, content: a.content };
}
