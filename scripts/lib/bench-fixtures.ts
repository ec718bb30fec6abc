import type { DeepPartial } from 'typeorm';
import type { PartType } from '../../server/modules/catalog/part-type.entity.ts';

/**
 * The invented small-signal NPN the benches measure (TO-92, hFE 110–320 at 2 mA / 5 V, Vbe
 * 580–700 mV, common-practice temperature coefficients), under the given part number.
 */
export function inventedBenchNpn(partNumber: string, description: string): DeepPartial<PartType> {
  return {
    partNumber,
    description,
    polarity: 'NPN',
    packageName: 'TO-92',
    hfeIcMa: 2,
    hfeVceV: 5,
    vbeIcMa: 2,
    hfeMin: 110,
    hfeMax: 320,
    vbeMinMv: 580,
    vbeMaxMv: 700,
    vbeTcMvPerC: -2,
    hfeTcPctPerC: 0.5,
    msl: 'not-classified',
    esdHbmClass: '1B',
    samplingMethod: 'attribute',
    inspectionLevel: 'II',
    aql: 1.0,
    matchHfePct: 5,
    matchVbeMv: 2,
    active: true,
  };
}
