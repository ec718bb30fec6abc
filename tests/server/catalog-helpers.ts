import type { DataSource } from 'typeorm';
import type { GainBinInput, PartTypeInput } from '../../shared/api/catalog.ts';
import type { Role } from '../../shared/api/roles.ts';
import type { Agent } from './helpers.ts';
import { makeUser } from './helpers.ts';

export const uniq = () => Math.random().toString(36).slice(2, 8).toUpperCase();

export const NON_QUALITY_ROLES: Role[] = ['inspector', 'buyer', 'assembler'];

/** A valid small-signal NPN part type body with a unique part number. */
export function partBody(overrides: Partial<PartTypeInput> = {}): PartTypeInput {
  return {
    partNumber: `T-N${uniq()}`,
    description: 'Test small-signal NPN',
    polarity: 'NPN',
    packageName: 'TO-92',
    hfeIcMa: 2,
    hfeVceV: 5,
    vbeIcMa: 2,
    hfeMin: 100,
    hfeMax: 300,
    vbeMinMv: 600,
    vbeMaxMv: 720,
    msl: 'not-classified',
    esdHbmClass: '2',
    ...overrides,
  };
}

/** Four adjacent bins covering hFE 100–300. */
export function fourBins(): GainBinInput[] {
  return [
    { code: 'A', label: 'hFE 100–150', hfeMin: 100, hfeMax: 150 },
    { code: 'B', label: 'hFE 150–200', hfeMin: 150, hfeMax: 200 },
    { code: 'C', label: 'hFE 200–250', hfeMin: 200, hfeMax: 250 },
    { code: 'D', label: 'hFE 250–300', hfeMin: 250, hfeMax: 300 },
  ];
}

export async function createPart(agent: Agent, overrides: Partial<PartTypeInput> = {}): Promise<{ id: number; partNumber: string }> {
  const res = await agent.post('/api/part-types').set('x-csrf-token', agent.csrf).send(partBody(overrides));
  if (res.status !== 201) throw new Error(`createPart: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

export async function createSupplierVia(agent: Agent, overrides: Record<string, unknown> = {}): Promise<{ id: number; code: string; name: string }> {
  const res = await agent
    .post('/api/suppliers')
    .set('x-csrf-token', agent.csrf)
    .send({ code: `S${uniq()}`, name: 'Test Distribution Ltd', approval: 'approved', ...overrides });
  if (res.status !== 201) throw new Error(`createSupplier: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

/** Inserts a lot row directly (the Dock's API is not needed to prove catalog rules). */
export async function insertLot(
  ds: DataSource,
  v: { supplierId: number; partTypeId: number; binSchemeId?: number | null; supplierPartNumber?: string | null },
): Promise<number> {
  const receiver = await makeUser(ds, 'inspector');
  const rows: { id: number }[] = await ds.query(
    `INSERT INTO lot (code, supplier_id, part_type_id, quantity, supplier_part_number, bin_scheme_id, received_by)
     VALUES ($1, $2, $3, 100, $4, $5, $6) RETURNING id`,
    [`T-${uniq()}${uniq()}`, v.supplierId, v.partTypeId, v.supplierPartNumber ?? null, v.binSchemeId ?? null, receiver.id],
  );
  return rows[0].id;
}

export const fields = (body: { errors?: { field: string }[] }) => (body.errors ?? []).map((e) => e.field);
