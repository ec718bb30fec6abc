import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { parseBody } from '../../http/validate.ts';
import { ParseLabelDto } from './parse-label.dto.ts';
import { parseScannedText } from './labels.service.ts';

/** Reading scanned labels changes nothing, so any signed-in user may call it (Dock, Bins, Pairing). */
export function labelsRouter(ds: DataSource): Router {
  const r = Router();
  r.post('/parse', async (req, res) => {
    const dto = await parseBody(ParseLabelDto, req.body);
    res.json(await parseScannedText(ds, dto.text));
  });
  return r;
}
