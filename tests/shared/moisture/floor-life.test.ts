import { describe, it, expect } from 'vitest';
import { MoistureInputError, floorLifeStatus } from '../../../shared/domain/moisture/index.ts';

const HOUR = 3_600_000;
const OPENED = new Date(Date.UTC(2026, 11, 1, 8, 0));
const after = (hours: number) => new Date(OPENED.getTime() + hours * HOUR);

function fieldOf(action: () => unknown): string {
  try {
    action();
  } catch (error) {
    if (error instanceof MoistureInputError) return error.field;
    throw error;
  }
  throw new Error('expected a MoistureInputError');
}

describe('floorLifeStatus (J-STD-033 floor-life clock)', () => {
  // MSL 3 floor life 168 h at ≤ 30 °C / 60 % RH: J-STD-033, reference.md §6 [from memory].
  // Warning at 80 % of the floor life (134.4 h) is the default [common practice].
  it.each([
    [100, 'ok', 68],
    [134, 'ok', 34],
    [134.4, 'warning', 33.6],
    [150, 'warning', 18],
    [167.9, 'warning', 0.1],
    [168, 'expired', 0],
    [200, 'expired', 0],
  ])('MSL 3 opened %s h ago is %s with %s h left', (hoursOpen, state, hoursLeft) => {
    const status = floorLifeStatus({ level: '3', openedAt: OPENED, now: after(hoursOpen) });
    expect(status.state).toBe(state);
    expect(status.hoursLeft).toBeCloseTo(hoursLeft, 9);
    expect(status.exposureHours).toBeCloseTo(hoursOpen, 9);
    expect(status.expiresAt?.toISOString()).toBe(after(168).toISOString());
  });

  it('MSL 3 opened 200 h ago says a bake is needed and defers to the site procedure', () => {
    const status = floorLifeStatus({ level: '3', openedAt: OPENED, now: after(200) });
    expect(status.message).toContain('exceeded by 32.0 h');
    expect(status.message).toContain('bake');
    expect(status.message).toContain("site's moisture-control procedure");
  });

  it('states the assumed ambient conditions in the message', () => {
    const status = floorLifeStatus({ level: '3', openedAt: OPENED, now: after(100) });
    expect(status.message).toContain('≤ 30 °C / 60 % RH');
  });

  it('with a warning fraction of 0.5, MSL 3 at 100 h is already a warning', () => {
    expect(floorLifeStatus({ level: '3', openedAt: OPENED, now: after(100), warnAtFraction: 0.5 }).state).toBe('warning');
  });

  // MSL 1 unlimited, MSL 2 one year: J-STD-033 [from memory]; the clock runs for 2a–6 only (product brief).
  it.each([['1'], ['2'], ['MSL 1']])('MSL %s is not-applicable with no clock', (level) => {
    const status = floorLifeStatus({ level, openedAt: OPENED, now: after(10_000) });
    expect(status.state).toBe('not-applicable');
    expect(status.hoursLeft).toBeNull();
    expect(status.expiresAt).toBeNull();
  });

  it('MSL 2a opened 600 h ago is a warning against its 672 h floor life', () => {
    // MSL 2a four weeks = 672 h, J-STD-033 [from memory]; 600/672 = 0.89 ≥ 0.8.
    const status = floorLifeStatus({ level: '2a', openedAt: OPENED, now: after(600) });
    expect(status.state).toBe('warning');
    expect(status.hoursLeft).toBeCloseTo(72, 9);
  });

  it('MSL 4 with 50 h of earlier exposure and 10 h now is a warning that runs out 22 h after opening', () => {
    // MSL 4 floor life 72 h, J-STD-033 [from memory]; 60/72 = 0.83 ≥ 0.8.
    const status = floorLifeStatus({ level: '4', openedAt: OPENED, now: after(10), cumulativeExposureHours: 50 });
    expect(status.state).toBe('warning');
    expect(status.hoursLeft).toBeCloseTo(12, 9);
    expect(status.expiresAt?.toISOString()).toBe(after(22).toISOString());
  });

  it('MSL 6 without a time on the label is expired at once and asks for a bake', () => {
    // MSL 6: bake before use, J-STD-033 [from memory].
    const status = floorLifeStatus({ level: '6', openedAt: OPENED, now: OPENED });
    expect(status.state).toBe('expired');
    expect(status.message).toContain('bake before use');
  });

  it('MSL 6 baked with a 6 h time on the label is ok 2 h later', () => {
    const status = floorLifeStatus({ level: '6', openedAt: OPENED, now: after(2), timeOnLabelHours: 6 });
    expect(status.state).toBe('ok');
    expect(status.hoursLeft).toBeCloseTo(4, 9);
  });

  it.each([
    [{ level: '7', openedAt: OPENED, now: after(1) }, 'level'],
    [{ level: '3', openedAt: OPENED, now: after(-1) }, 'now'],
    [{ level: '3', openedAt: new Date(Number.NaN), now: after(1) }, 'openedAt'],
    [{ level: '3', openedAt: OPENED, now: after(1), warnAtFraction: 0 }, 'warnAtFraction'],
    [{ level: '3', openedAt: OPENED, now: after(1), warnAtFraction: 1.5 }, 'warnAtFraction'],
    [{ level: '3', openedAt: OPENED, now: after(1), cumulativeExposureHours: -1 }, 'cumulativeExposureHours'],
  ])('with bad input %j, throws MoistureInputError for field %s', (input, field) => {
    expect(fieldOf(() => floorLifeStatus(input))).toBe(field);
  });
});
