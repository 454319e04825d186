// Reading Retry-After (RFC 9110 §10.2.3: Retry-After = HTTP-date / delay-seconds; the three
// HTTP-date forms a recipient must accept are in §5.6.7).
import { describe, expect, it } from 'vitest';
import { retryAfterMs } from '@/lib/http';

const now = Date.parse('1994-11-06T08:49:30.000Z');

describe('retryAfterMs', () => {
  it('reads delay-seconds as whole seconds', () => {
    expect(retryAfterMs('3', now)).toBe(3_000);
    expect(retryAfterMs('0', now)).toBe(0);
    expect(retryAfterMs(' 120 ', now)).toBe(120_000);
  });

  it('reads an HTTP-date in any of its three forms as the time until then', () => {
    expect(retryAfterMs('Sun, 06 Nov 1994 08:49:37 GMT', now)).toBe(7_000); // IMF-fixdate
    expect(retryAfterMs('Sunday, 06-Nov-94 08:49:37 GMT', now)).toBe(7_000); // obsolete RFC 850
    expect(retryAfterMs('Sun Nov  6 08:49:37 1994', now)).toBe(7_000); // obsolete asctime, UTC without saying so
  });

  it('is 0 for a date already past', () => {
    expect(retryAfterMs('Sun, 06 Nov 1994 08:49:00 GMT', now)).toBe(0);
  });

  it('is undefined when missing or not either form', () => {
    for (const header of [null, '', 'soon', '1.5', '-3', '3s', '2 3', 'Sun, 99 Nov 1994 08:49:37 GMT']) {
      expect(retryAfterMs(header, now), String(header)).toBeUndefined();
    }
  });
});
