import path from 'node:path';
import { Router } from 'express';
import type { Transporter } from 'nodemailer';
import type { DataSource } from 'typeorm';
import { DocumentStore } from '../lots/documents/document-store.ts';
import { alertsRouter } from './alerts.routes.ts';
import { ncrsRouter } from './ncrs.routes.ts';
import { orderPlansRouter } from './order-plans.routes.ts';
import { scorecardsRouter } from './scorecards.routes.ts';

export interface SupplierQualityOptions {
  /** Data folder; supplier answers to NCRs go to `<dataDir>/ncr-answers`. */
  dataDir: string;
  /** The app's SMTP transport and sender, for "Send" on an NCR. */
  transport: Transporter;
  from: string;
}

/**
 * The Suppliers area (full paths): /scorecards, /drift-alerts, /ncrs, /order-plans. Buyers and
 * quality engineers read and write; inspectors and assemblers are turned away (403) on every
 * route, reads included (guard.ts).
 */
export function supplierQualityRouter(ds: DataSource, o: SupplierQualityOptions): Router {
  const r = Router();
  const store = new DocumentStore(path.join(o.dataDir, 'ncr-answers'));
  r.use(scorecardsRouter(ds));
  r.use(alertsRouter(ds));
  r.use(ncrsRouter(ds, store, { transport: o.transport, from: o.from }));
  r.use(orderPlansRouter(ds));
  return r;
}
