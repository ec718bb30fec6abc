import type { DataSource, EntityManager } from 'typeorm';
import type { ApprovalStatus, GainBinInput, MslChoice, Polarity } from '../shared/api/catalog.ts';
import { validateBinScheme } from '../shared/domain/binning/index.ts';
import type { SamplingMethod } from '../shared/domain/sampling/index.ts';
import { recordAudit } from '../server/modules/audit/audit.service.ts';
import { lockSchemeVersion } from '../server/modules/catalog/bin-schemes.service.ts';
import { GainBinRow, GainBinSchemeVersion } from '../server/modules/catalog/gain-bin-scheme.entity.ts';
import { PartType } from '../server/modules/catalog/part-type.entity.ts';
import { Supplier, SupplierContact, SupplierPart } from '../server/modules/suppliers/supplier.entity.ts';
import { User } from '../server/modules/users/user.entity.ts';

/*
 * The catalog of the invented Harrow Point Audio Works scenario. Part numbers (HPA-…), supplier
 * names, supplier part numbers and contacts are all made up. Limits and test conditions follow
 * common practice for the device class (small-signal hFE 100–300 at a few mA, Vbe about
 * 0.6–0.7 V at 2 mA, reference.md §4); they are demo values, not a datasheet.
 */

interface DemoPart {
  partNumber: string;
  description: string;
  polarity: Polarity;
  packageName: string;
  hfeIcMa: number;
  hfeVceV: number;
  vbeIcMa: number;
  hfeMin: number | null;
  hfeMax: number | null;
  vbeMinMv: number | null;
  vbeMaxMv: number | null;
  vbeTcMvPerC: number;
  hfeTcPctPerC: number;
  msl: MslChoice;
  esdHbmClass: string | null;
  samplingMethod: SamplingMethod;
  inspectionLevel: string;
  aql: number;
  matchHfePct: number;
  matchVbeMv: number;
  active: boolean;
  /** Scheme versions, oldest first; `locked` marks a version the bench already used. */
  schemes: { note: string; bins: GainBinInput[]; locked?: boolean }[];
}

const bin = (code: string, hfeMin: number, hfeMax: number, extra: Partial<GainBinInput> = {}): GainBinInput => ({
  code,
  label: `hFE ${hfeMin}–${hfeMax}`,
  hfeMin,
  hfeMax,
  ...extra,
});

const SMALL_SIGNAL_BINS = [bin('A', 100, 140), bin('B', 140, 180), bin('C', 180, 220), bin('D', 220, 260), bin('E', 260, 300)];
const LOW_NOISE_BINS = [bin('L1', 200, 250), bin('L2', 250, 300), bin('L3', 300, 350), bin('L4', 350, 400), bin('L5', 400, 450)];
const DRIVER_BINS = [bin('R', 60, 100), bin('S', 100, 150), bin('T', 150, 200)];
const OUTPUT_BINS_V1 = [bin('P1', 55, 100), bin('P2', 100, 160)];
const OUTPUT_BINS_V2 = [bin('P1', 55, 80), bin('P2', 80, 110), bin('P3', 110, 160)];

const smallSignal = {
  packageName: 'TO-92',
  hfeIcMa: 2,
  hfeVceV: 5,
  vbeIcMa: 2,
  hfeMin: 100,
  hfeMax: 300,
  vbeMinMv: 600,
  vbeMaxMv: 720,
  vbeTcMvPerC: -2.0,
  hfeTcPctPerC: 0.5,
  msl: 'not-classified' as const,
  esdHbmClass: '1C',
  samplingMethod: 'attribute' as const,
  inspectionLevel: 'II',
  aql: 0.65,
  matchHfePct: 3,
  matchVbeMv: 1,
  active: true,
};

const lowNoise = {
  packageName: 'SOT-23',
  hfeIcMa: 2,
  hfeVceV: 5,
  vbeIcMa: 2,
  hfeMin: 200,
  hfeMax: 450,
  vbeMinMv: 580,
  vbeMaxMv: 700,
  vbeTcMvPerC: -2.0,
  hfeTcPctPerC: 0.6,
  msl: '3' as const,
  esdHbmClass: '1B',
  samplingMethod: 'variables' as const,
  inspectionLevel: 'II',
  aql: 1.0,
  matchHfePct: 2,
  matchVbeMv: 1,
  active: true,
};

const driver = {
  packageName: 'TO-126',
  hfeIcMa: 150,
  hfeVceV: 2,
  vbeIcMa: 150,
  hfeMin: 60,
  hfeMax: 200,
  vbeMinMv: 650,
  vbeMaxMv: 850,
  vbeTcMvPerC: -2.0,
  hfeTcPctPerC: 0.5,
  msl: 'not-classified' as const,
  esdHbmClass: '3A',
  samplingMethod: 'attribute' as const,
  inspectionLevel: 'II',
  aql: 1.0,
  matchHfePct: 10,
  matchVbeMv: 5,
  active: true,
};

const output = {
  packageName: 'TO-3P',
  hfeIcMa: 1000,
  hfeVceV: 5,
  vbeIcMa: 1000,
  hfeMin: 55,
  hfeMax: 160,
  vbeMinMv: 750,
  vbeMaxMv: 1100,
  vbeTcMvPerC: -2.2,
  hfeTcPctPerC: 0.5,
  msl: 'not-classified' as const,
  esdHbmClass: '3B',
  samplingMethod: 'zero-acceptance' as const,
  inspectionLevel: 'II',
  aql: 0.65,
  matchHfePct: 10,
  matchVbeMv: 10,
  active: true,
};

export const DEMO_PARTS: DemoPart[] = [
  { ...smallSignal, partNumber: 'HPA-N201', description: 'Small-signal NPN for matched input pairs', polarity: 'NPN', schemes: [{ note: 'Five 40-wide bins for input-pair matching', bins: SMALL_SIGNAL_BINS }] },
  { ...smallSignal, partNumber: 'HPA-P202', description: 'Small-signal PNP, complement of HPA-N201', polarity: 'PNP', schemes: [{ note: 'Same bins as HPA-N201 for complementary pairs', bins: SMALL_SIGNAL_BINS }] },
  { ...lowNoise, partNumber: 'HPA-N215', description: 'Low-noise NPN for phono and microphone inputs', polarity: 'NPN', schemes: [{ note: 'Gain groups for the phono stage', bins: LOW_NOISE_BINS }] },
  { ...lowNoise, partNumber: 'HPA-P216', description: 'Low-noise PNP, complement of HPA-N215', polarity: 'PNP', schemes: [{ note: 'Gain groups for the phono stage', bins: LOW_NOISE_BINS }] },
  { ...driver, partNumber: 'HPA-N340', description: 'Medium-power NPN driver', polarity: 'NPN', schemes: [{ note: 'Driver pair bins', bins: DRIVER_BINS }] },
  { ...driver, partNumber: 'HPA-P341', description: 'Medium-power PNP driver, complement of HPA-N340', polarity: 'PNP', schemes: [{ note: 'Driver pair bins', bins: DRIVER_BINS }] },
  {
    ...output,
    partNumber: 'HPA-N580',
    description: 'Power output NPN for push-pull stages',
    polarity: 'NPN',
    schemes: [
      { note: 'Two coarse bins, used for the first output-stage lots', bins: OUTPUT_BINS_V1, locked: true },
      { note: 'Three bins for tighter complementary matching', bins: OUTPUT_BINS_V2 },
    ],
  },
  { ...output, partNumber: 'HPA-P581', description: 'Power output PNP, complement of HPA-N580', polarity: 'PNP', schemes: [{ note: 'Three bins for complementary matching', bins: OUTPUT_BINS_V2 }] },
  {
    ...smallSignal,
    partNumber: 'HPA-N101',
    description: 'General-purpose NPN (superseded by HPA-N201)',
    polarity: 'NPN',
    hfeMin: 80,
    hfeMax: 250,
    esdHbmClass: null,
    active: false,
    schemes: [],
  },
];

interface DemoSupplier {
  code: string;
  name: string;
  approval: ApprovalStatus;
  notes: string | null;
  contacts: { name: string; email: string; phone: string | null; duty: string | null }[];
  parts: [supplierPartNumber: string, partNumber: string][];
}

export const DEMO_SUPPLIERS: DemoSupplier[] = [
  {
    code: 'KLC',
    name: 'Kestrel Lane Components',
    approval: 'approved',
    notes: 'Franchised-line distributor (invented). Certificates of conformance with every lot.',
    contacts: [
      { name: 'Mira Holt', email: 'mira.holt@kestrel-lane.example.test', phone: '+44 1632 960 101', duty: 'quality' },
      { name: 'Tomas Reyne', email: 'tomas.reyne@kestrel-lane.example.test', phone: '+44 1632 960 102', duty: 'sales' },
    ],
    parts: [
      ['KL-2201-T92', 'HPA-N201'],
      ['KL-2202-T92', 'HPA-P202'],
      ['KL-4150-S23', 'HPA-N215'],
      ['KL-4151-S23', 'HPA-P216'],
      ['KL-8580-T3P', 'HPA-N580'],
      ['KL-8581-T3P', 'HPA-P581'],
    ],
  },
  {
    code: 'NES',
    name: 'Northmoor Electronic Supply',
    approval: 'conditional',
    notes: 'Conditional after a mixed date-code lot (invented); lots go to tightened inspection until the corrective action closes.',
    contacts: [
      { name: 'Priya Anand', email: 'priya.anand@northmoor.example.test', phone: '+44 1632 960 201', duty: 'quality' },
      { name: 'Owen Trask', email: 'owen.trask@northmoor.example.test', phone: null, duty: 'sales' },
    ],
    parts: [
      ['NM-N201A', 'HPA-N201'],
      ['NM-P202A', 'HPA-P202'],
      ['NM-340-D', 'HPA-N340'],
      ['NM-341-D', 'HPA-P341'],
    ],
  },
  {
    code: 'BPX',
    name: 'Brightwater Parts Exchange',
    approval: 'not-approved',
    notes: 'Broker (invented). Not approved: receiving needs a quality engineer’s override.',
    contacts: [{ name: 'Jonah Pell', email: 'jonah.pell@brightwater.example.test', phone: null, duty: 'sales' }],
    parts: [
      ['BW-SS-N201', 'HPA-N201'],
      ['BW-PWR-N580', 'HPA-N580'],
    ],
  },
];

const NOTE = 'demo scenario';

async function seedParts(m: EntityManager, author: number | null): Promise<number> {
  let created = 0;
  for (const { schemes, ...values } of DEMO_PARTS) {
    let part = await m.findOneBy(PartType, { partNumber: values.partNumber });
    if (!part) {
      part = await m.save(m.create(PartType, values));
      await recordAudit(m, { actor: null, action: 'part-type.create', entityType: 'part-type', entityId: part.id, after: values, note: NOTE });
      created++;
    }
    if (await m.existsBy(GainBinSchemeVersion, { partTypeId: part.id })) continue;
    for (const [i, s] of schemes.entries()) {
      const check = validateBinScheme(s.bins, { hfeMin: part.hfeMin, hfeMax: part.hfeMax });
      if (!check.ok) throw new Error(`Demo scheme of ${part.partNumber} is invalid: ${JSON.stringify(check.errors)}`);
      const scheme = await m.save(m.create(GainBinSchemeVersion, { partTypeId: part.id, version: i + 1, note: s.note, lockedAt: null, createdBy: author }));
      await m.save(
        s.bins.map((b, position) =>
          m.create(GainBinRow, {
            schemeId: scheme.id,
            position,
            code: b.code,
            label: b.label,
            hfeMin: b.hfeMin,
            hfeMax: b.hfeMax,
            vbeMinMv: b.vbeMinMv ?? null,
            vbeMaxMv: b.vbeMaxMv ?? null,
            gapBeforeIntended: b.gapBeforeIntended ?? false,
          }),
        ),
      );
      await recordAudit(m, {
        actor: null,
        action: 'bin-scheme.create',
        entityType: 'gain-bin-scheme',
        entityId: scheme.id,
        after: { partTypeId: part.id, partNumber: part.partNumber, version: scheme.version, note: s.note, bins: s.bins },
        note: NOTE,
      });
      if (s.locked) await lockSchemeVersion(m, scheme.id, { reason: NOTE });
      created++;
    }
  }
  return created;
}

async function seedSuppliers(m: EntityManager): Promise<number> {
  let created = 0;
  for (const { contacts, parts, ...values } of DEMO_SUPPLIERS) {
    let supplier = await m.findOneBy(Supplier, { code: values.code });
    if (!supplier) {
      supplier = await m.save(m.create(Supplier, values));
      await recordAudit(m, { actor: null, action: 'supplier.create', entityType: 'supplier', entityId: supplier.id, after: values, note: NOTE });
      created++;
    }
    for (const c of contacts) {
      if (await m.existsBy(SupplierContact, { supplierId: supplier.id, email: c.email })) continue;
      const saved = await m.save(m.create(SupplierContact, { ...c, supplierId: supplier.id }));
      await recordAudit(m, { actor: null, action: 'supplier.contact-add', entityType: 'supplier', entityId: supplier.id, after: { contactId: saved.id, ...c }, note: NOTE });
      created++;
    }
    for (const [spn, partNumber] of parts) {
      if (await m.existsBy(SupplierPart, { supplierId: supplier.id, supplierPartNumber: spn })) continue;
      const part = await m.findOneByOrFail(PartType, { partNumber });
      const saved = await m.save(m.create(SupplierPart, { supplierId: supplier.id, supplierPartNumber: spn, partTypeId: part.id }));
      await recordAudit(m, {
        actor: null,
        action: 'supplier.part-map',
        entityType: 'supplier',
        entityId: supplier.id,
        after: { mappingId: saved.id, supplierPartNumber: spn, partTypeId: part.id, partNumber },
        note: NOTE,
      });
      created++;
    }
  }
  return created;
}

/**
 * Loads the demo catalog: part types with gain-bin schemes, three distributors with contacts and
 * part-number mappings. Idempotent: only missing rows are created. Returns how many were created.
 */
export async function seedDemoCatalog(ds: DataSource, log: (l: string) => void = () => {}): Promise<number> {
  const created = await ds.transaction(async (m) => {
    const author = await m.findOneBy(User, { email: 'quality@harrowpoint.test' });
    return (await seedParts(m, author?.id ?? null)) + (await seedSuppliers(m));
  });
  if (created) log(`Demo scenario: created ${created} catalog rows (part types, bin schemes, suppliers, contacts, mappings).`);
  return created;
}
