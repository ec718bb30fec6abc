import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parseBody } from '../../http/validate.ts';
import { ScannerSettingsDto } from './scanner-settings.dto.ts';
import { getScannerSettingsView, putScannerSettings } from './settings.service.ts';

/** Site settings: any signed-in user reads them, quality engineers change them. */
export function settingsRouter(ds: DataSource): Router {
  const r = Router();
  r.get('/scanner', async (_req, res) => {
    res.json(await getScannerSettingsView(ds));
  });
  r.put('/scanner', requireRole('quality'), async (req, res) => {
    const dto = await parseBody(ScannerSettingsDto, req.body);
    res.json(await putScannerSettings(ds, currentUser(req), dto));
  });
  return r;
}
