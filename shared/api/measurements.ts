export type SessionMode = 'sample' | 'screen';
export type VoltageUnit = 'mV' | 'V';
export type CurrentUnit = 'nA' | 'uA';

/** POST /api/lots/:id/sessions */
export interface StartSessionRequest {
  instrument: string;
  /** Ambient temperature at the bench, °C. */
  ambientC: number;
  mode: SessionMode;
}

export interface SessionRow {
  id: number;
  lotId: number;
  instrument: string;
  ambientC: number;
  mode: SessionMode;
  operatorId: number;
  operatorName: string;
  startedAt: string;
  closedAt: string | null;
}

/** GET /api/lots/:id/sessions */
export interface SessionsResponse {
  sessions: SessionRow[];
  /** Current (not superseded) measurements of the lot. */
  measured: number;
  /** One above the highest measured position. */
  nextPosition: number;
}

/** POST /api/lots/:id/measurements */
export interface RecordMeasurementRequest {
  sessionId: number;
  position: number;
  hfe: number;
  vbe: number;
  vbeUnit: VoltageUnit;
  vceSat?: number | null;
  vceSatUnit?: VoltageUnit;
  leakage?: number | null;
  leakageUnit?: CurrentUnit;
}

/** POST /api/lots/:id/measurements/:measurementId/corrections */
export interface CorrectMeasurementRequest extends Omit<RecordMeasurementRequest, 'position'> {
  reason: string;
}

export type LimitFlag = 'hfe-low' | 'hfe-high' | 'vbe-low' | 'vbe-high';

export interface MeasurementRow {
  id: string;
  sessionId: number;
  position: number;
  /** As measured at the session's ambient temperature. */
  hfe: number;
  vbeMv: number;
  vceSatMv: number | null;
  leakageNa: number | null;
  /** Referred to 25 °C. */
  hfe25: number;
  vbeMv25: number;
  ambientC: number;
  source: 'grid' | 'import';
  supersedesId: string | null;
  superseded: boolean;
  correctionReason: string | null;
  createdByName: string;
  createdAt: string;
  /** Limits of the part type the 25 °C values break. */
  flags: LimitFlag[];
}

export type MeasurementSort = 'position' | 'hfe25' | 'vbeMv25' | 'createdAt';

/** Columns of the tester file mapped to our fields; optional fields may be left unmapped. */
export interface ImportMapping {
  position: string;
  hfe: string;
  vbe: string;
  vceSat?: string | null;
  leakage?: string | null;
}

export interface ImportUnits {
  vbe: VoltageUnit;
  vceSat: VoltageUnit;
  leakage: CurrentUnit;
}

/** GET /api/instrument-mappings/:instrument */
export interface InstrumentMappingResponse {
  instrument: string;
  mapping: ImportMapping;
  units: ImportUnits;
  updatedAt: string;
}

/** Multipart fields of POST /api/lots/:id/measurements/import next to the `file`. */
export interface ImportFields {
  sessionId: number;
  mapping: ImportMapping;
  units: ImportUnits;
  /** Client-chosen token to follow the server-side phase with GET …/import/progress/:token. */
  progressToken?: string;
}

export interface ImportResult {
  imported: number;
  sessionId: number;
  /** Server time for parse, validation and the write, ms. */
  ms: number;
}

export type ImportPhase = 'receiving' | 'parsing' | 'validating' | 'writing' | 'done' | 'failed';

export interface ImportProgress {
  phase: ImportPhase;
  done: number;
  total: number;
  message: string;
}
