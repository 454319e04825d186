// Signing out of a live screen: the screen's own background request can answer 401 in the moment
// between the session ending and the page changing. That answer must not turn "Sign out" into a trip
// to sign-in that comes back to the screen (/signin?next=/bar).
import { afterEach, describe, expect, it, vi } from 'vitest';
import { http, signOut } from '../../src/lib/http';

afterEach(() => vi.unstubAllGlobals());

describe('signOut', () => {
  it('goes to plain sign-in even when a screen request answers 401 while the session ends', async () => {
    window.history.replaceState(null, '', '/bar');
    const visits: string[] = [];
    vi.stubGlobal('location', { ...window.location, pathname: '/bar', search: '', assign: (url: string) => visits.push(url) });
    let endSession!: () => void;
    vi.stubGlobal(
      'fetch',
      vi.fn((_url: string, init: RequestInit) => {
        if (init.method === 'DELETE') return new Promise<Response>((resolve) => (endSession = () => resolve(new Response(null, { status: 204 }))));
        return Promise.resolve(Response.json({ error: { code: 'unauthenticated', message: 'Sign in first' } }, { status: 401 }));
      }),
    );
    const leaving = signOut();
    await expect(http('GET', '/bar/lanes')).rejects.toMatchObject({ status: 401 });
    endSession();
    await leaving;
    expect(visits).toEqual(['/signin']);
  });
});
