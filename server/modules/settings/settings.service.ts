import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { FieldError } from '../../../shared/api/problem.ts';
import type { ScannerSettings, ScannerSettingsResponse } from '../../../shared/api/settings.ts';
import { DEFAULT_PURCHASE_ORDER_PATTERN, DEFAULT_SUBSTITUTES, type SeparatorSubstitutes } from '../../../shared/domain/labels/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { User } from '../users/user.entity.ts';
import { SiteSetting } from './site-setting.entity.ts';

const SCANNER_KEY = 'scanner';
const EMPTY: ScannerSettings = { gs: [], rs: [], eot: [], purchaseOrderPattern: null };

function readScanner(row: SiteSetting | null): ScannerSettings {
  const v = (row?.value ?? {}) as Partial<ScannerSettings>;
  const list = (x: unknown) => (Array.isArray(x) ? x.filter((s): s is string => typeof s === 'string' && s !== '') : []);
  return {
    gs: list(v.gs),
    rs: list(v.rs),
    eot: list(v.eot),
    purchaseOrderPattern: typeof v.purchaseOrderPattern === 'string' && v.purchaseOrderPattern ? v.purchaseOrderPattern : null,
  };
}

/** The site's scanner settings (only what the site configured; the built-ins are added by `effectiveSubstitutes`). */
export async function getScannerSettings(m: DataSource | EntityManager): Promise<ScannerSettings> {
  const row = await m.getRepository(SiteSetting).findOneBy({ key: SCANNER_KEY });
  return row ? readScanner(row) : { ...EMPTY };
}

/** Built-in substitutes plus the site's own, per separator. */
export function effectiveSubstitutes(s: ScannerSettings): SeparatorSubstitutes {
  return {
    gs: [...DEFAULT_SUBSTITUTES.gs, ...s.gs],
    rs: [...DEFAULT_SUBSTITUTES.rs, ...s.rs],
    eot: [...DEFAULT_SUBSTITUTES.eot, ...s.eot],
  };
}

export async function getScannerSettingsView(ds: DataSource): Promise<ScannerSettingsResponse> {
  const row = await ds.getRepository(SiteSetting).findOneBy({ key: SCANNER_KEY });
  const by = row?.updatedBy ? await ds.getRepository(User).findOneBy({ id: row.updatedBy }) : null;
  return {
    configured: readScanner(row),
    defaults: {
      gs: [...DEFAULT_SUBSTITUTES.gs],
      rs: [...DEFAULT_SUBSTITUTES.rs],
      eot: [...DEFAULT_SUBSTITUTES.eot],
      purchaseOrderPattern: DEFAULT_PURCHASE_ORDER_PATTERN.source,
    },
    updatedAt: row ? row.updatedAt.toISOString() : null,
    updatedBy: by?.name ?? null,
  };
}

/**
 * Checks what a plain list validator cannot: a substitute made only of letters, digits or
 * spaces would be found inside ordinary label data; one text cannot stand for two separators;
 * the purchase-order pattern must compile.
 */
function checkScanner(input: ScannerSettings): FieldError[] {
  const errors: FieldError[] = [];
  const owner = new Map<string, string>();
  for (const [kind, defaults] of [['gs', DEFAULT_SUBSTITUTES.gs], ['rs', DEFAULT_SUBSTITUTES.rs], ['eot', DEFAULT_SUBSTITUTES.eot]] as const) {
    for (const d of defaults) owner.set(d.toLowerCase(), kind);
  }
  for (const kind of ['gs', 'rs', 'eot'] as const) {
    input[kind].forEach((s, i) => {
      const field = `${kind}[${i}]`;
      if (/^[\p{L}\p{N} ]+$/u.test(s)) {
        errors.push({ field, message: `"${s}" has only letters, digits or spaces and would match ordinary label data; include a symbol such as < > { } ^` });
        return;
      }
      const seen = owner.get(s.toLowerCase());
      if (seen && seen !== kind) errors.push({ field, message: `"${s}" already stands for ${seen.toUpperCase()}` });
      else owner.set(s.toLowerCase(), kind);
    });
  }
  if (input.purchaseOrderPattern) {
    try {
      new RegExp(input.purchaseOrderPattern, 'i');
    } catch {
      errors.push({ field: 'purchaseOrderPattern', message: 'purchaseOrderPattern is not a valid regular expression' });
    }
  }
  return errors;
}

/** Replaces the site's scanner settings (quality engineers), with before and after in the audit trail. */
export async function putScannerSettings(ds: DataSource, actor: SessionUser, input: ScannerSettings): Promise<ScannerSettingsResponse> {
  const clean: ScannerSettings = {
    gs: [...new Set(input.gs)],
    rs: [...new Set(input.rs)],
    eot: [...new Set(input.eot)],
    purchaseOrderPattern: input.purchaseOrderPattern?.trim() ? input.purchaseOrderPattern.trim() : null,
  };
  const errors = checkScanner(clean);
  if (errors.length) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);
  await ds.transaction(async (m) => {
    const repo = m.getRepository(SiteSetting);
    const before = await repo.findOne({ where: { key: SCANNER_KEY }, lock: { mode: 'pessimistic_write' } });
    await repo.save(repo.create({ key: SCANNER_KEY, value: { ...clean }, updatedBy: actor.id, updatedAt: new Date() }));
    await recordAudit(m, {
      actor,
      action: 'settings.scanner',
      entityType: 'site_setting',
      entityId: SCANNER_KEY,
      before: before ? readScanner(before) : null,
      after: clean,
    });
  });
  return getScannerSettingsView(ds);
}
