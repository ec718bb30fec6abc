import { Router } from 'express';
import { buyerOrQuality } from './guard.ts';
import { parseBody } from '../../http/validate.ts';
import type { DataSource } from 'typeorm';
import { AppError } from '../../http/app-error.ts';
import { getOrderPlan, startOrderPlan } from './order-plans.service.ts';
import { OrderPlanDto } from './supplier-quality.dto.ts';

export function orderPlansRouter(ds: DataSource): Router {
  const r = Router();

  /** Starts a plan; answers 202 with the job (id, progress) at once. Poll GET /order-plans/:id. */
  r.post('/order-plans', buyerOrQuality, async (req, res) => {
    const dto = await parseBody(OrderPlanDto, req.body);
    const job = await startOrderPlan(ds, dto);
    res.status(202).location(`/api/order-plans/${job.id}`).json(job);
  });

  r.get('/order-plans/:id', buyerOrQuality, (req, res) => {
    const id = String(req.params.id);
    if (!/^[0-9a-f-]{36}$/.test(id)) throw AppError.notFound(`Order plan ${id}`);
    res.json(getOrderPlan(id));
  });

  return r;
}
