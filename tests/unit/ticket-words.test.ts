// Local wall-clock times with their offset, as the ticket CSV writes them.
import { describe, expect, it } from 'vitest';
import { localIsoWithOffset } from '@/domain/ticket-words';

describe('localIsoWithOffset', () => {
  it('writes the café clock and its UTC offset (IANA tz database offsets, from memory)', () => {
    // New York is UTC−5 in winter (EST) and UTC−4 in summer (EDT)
    expect(localIsoWithOffset('2026-03-02T14:00:00.000Z', 'America/New_York')).toBe('2026-03-02T09:00:00-05:00');
    expect(localIsoWithOffset('2026-07-01T14:00:00.000Z', 'America/New_York')).toBe('2026-07-01T10:00:00-04:00');
    // India is UTC+5:30 all year; the local date moves past midnight
    expect(localIsoWithOffset('2026-03-02T20:00:00.000Z', 'Asia/Kolkata')).toBe('2026-03-03T01:30:00+05:30');
    expect(localIsoWithOffset('2026-03-02T00:00:05.000Z', 'UTC')).toBe('2026-03-02T00:00:05+00:00');
  });
});
