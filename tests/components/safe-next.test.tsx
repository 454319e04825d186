// After sign-in the screen goes to ?next= only when it is a path on this site (OWASP "Unvalidated
// Redirects and Forwards": allow-list the destination). Browsers read '//host' and '/\host' as
// another host (WHATWG URL: backslash is a path separator in special schemes).
import { describe, expect, it } from 'vitest';
import { safeNext } from '@/routes/signin';

describe('safeNext', () => {
  it('keeps paths on this site, with their query', () => {
    expect(safeNext('/bar')).toBe('/bar');
    expect(safeNext('/reports?from=2026-12-01')).toBe('/reports?from=2026-12-01');
  });
  it.each(['//evil.example', '/\\evil.example', '/\\/evil.example', 'https://evil.example', 'javascript:alert(1)', ''])('refuses %j', (next) => {
    expect(safeNext(next)).toBeNull();
  });
  it('refuses nothing given', () => expect(safeNext(null)).toBeNull());
});
