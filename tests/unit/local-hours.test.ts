// UTC offsets of a café's zone over a period, for the Reports' café-local hours.
// US daylight saving time (from memory: Energy Policy Act of 2005): it starts on the second Sunday
// of March at 02:00 local standard time and ends on the first Sunday of November at 02:00 local
// daylight time. In 2026: 8 March 07:00 UTC (EST, UTC−5 → EDT, UTC−4) and 1 November 06:00 UTC.
// India (from memory): UTC+05:30 all year, no daylight saving time.
import { describe, expect, it } from 'vitest';
import { inHourOrder } from '@/domain/reports';
import { localHour, offsetMinutes, offsetStretches } from '@server/reports/local-hours';

const ms = (iso: string) => Date.parse(iso);

describe('offsetMinutes', () => {
  it('New York: −300 in winter, −240 in summer; Kolkata +330; UTC 0', () => {
    expect(offsetMinutes(ms('2026-01-15T12:00:00Z'), 'America/New_York')).toBe(-300);
    expect(offsetMinutes(ms('2026-07-15T12:00:00Z'), 'America/New_York')).toBe(-240);
    expect(offsetMinutes(ms('2026-07-15T12:00:00Z'), 'Asia/Kolkata')).toBe(330);
    expect(offsetMinutes(ms('2026-07-15T12:00:00.999Z'), 'UTC')).toBe(0);
  });
});

describe('offsetStretches', () => {
  it('a year in New York: three stretches, changing on the exact millisecond of each switch', () => {
    expect(offsetStretches(ms('2025-12-01T05:00:00Z'), ms('2026-12-01T05:00:00Z'), 'America/New_York')).toEqual([
      { startMs: ms('2025-12-01T05:00:00Z'), offsetMinutes: -300 },
      { startMs: ms('2026-03-08T07:00:00.000Z'), offsetMinutes: -240 },
      { startMs: ms('2026-11-01T06:00:00.000Z'), offsetMinutes: -300 },
    ]);
  });

  it('a switch inside the last, partial day is found too', () => {
    const stretches = offsetStretches(ms('2026-03-07T12:00:00Z'), ms('2026-03-08T08:00:00Z'), 'America/New_York');
    expect(stretches.map((s) => s.offsetMinutes)).toEqual([-300, -240]);
    expect(stretches[1].startMs).toBe(ms('2026-03-08T07:00:00Z'));
  });

  it('a zone without daylight saving time: one stretch', () => {
    expect(offsetStretches(ms('2026-01-01T00:00:00Z'), ms('2026-12-31T00:00:00Z'), 'Asia/Kolkata')).toEqual([
      { startMs: ms('2026-01-01T00:00:00Z'), offsetMinutes: 330 },
    ]);
  });
});

describe('localHour and shift order', () => {
  it('a shift opened at 22:00 in New York lists its hours 22, 23, 0, 1', () => {
    // the offsets above: 03:00 UTC on 3 March 2026 is 22:00 EST (UTC−5) on 2 March
    expect(localHour(ms('2026-03-03T03:00:00Z'), 'America/New_York')).toBe(22);
    // from memory (India, UTC+05:30): 20:00 UTC is 01:30 the next day → hour 1
    expect(localHour(ms('2026-07-15T20:00:00Z'), 'Asia/Kolkata')).toBe(1);
    // hand-worked: hours in the order a 22:00 shift worked them; a calendar range from 0
    const rows = [0, 1, 22, 23].map((hour) => ({ hour }));
    expect(inHourOrder(rows, 22).map((r) => r.hour)).toEqual([22, 23, 0, 1]);
    expect(inHourOrder(rows).map((r) => r.hour)).toEqual([0, 1, 22, 23]);
  });
});
