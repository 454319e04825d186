// Signing out of a live screen: the screen's own background request can answer 401 in the moment
// between the session ending and the page changing. That answer must not turn "Sign out" into a trip
// to sign-in that comes back to the screen (/signin?next=/bar).
import { afterEach, describe, expect, it, vi } from 'vitest';
import { holdReads, http, signOut } from '@/lib/http';

afterEach(() => vi.unstubAllGlobals());

describe('signOut', () => {
  it('goes to plain sign-in even when a screen request answers 401 while the session ends', async () => {
    window.history.replaceState(null, '', '/bar');
    const visits: string[] = [];
    vi.stubGlobal('location', { ...window.location, pathname: '/bar', search: '', assign: (url: string) => visits.push(url) });
    let endSession!: () => void;
    let answerScreen!: () => void;
    vi.stubGlobal(
      'fetch',
      vi.fn((_url: string, init: RequestInit) => {
        if (init.method === 'DELETE') return new Promise<Response>((resolve) => (endSession = () => resolve(new Response(null, { status: 204 }))));
        return new Promise<Response>(
          (resolve) => (answerScreen = () => resolve(Response.json({ error: { code: 'unauthenticated', message: 'Sign in first' } }, { status: 401 }))),
        );
      }),
    );
    // the screen's read is on its way when the person signs out; it answers 401 once the session is gone
    const read = http('GET', '/bar/lanes');
    const leaving = signOut();
    answerScreen();
    await expect(read).rejects.toMatchObject({ status: 401 });
    endSession();
    await leaving;
    expect(visits).toEqual(['/signin']);
  });
});

describe('holdReads', () => {
  it('asks the server nothing while a person switch is pending, and reads again once it is refused', async () => {
    const fetched: string[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn((url: string) => {
        fetched.push(url);
        return Promise.resolve(Response.json({ ok: true }));
      }),
    );
    holdReads(true);
    await expect(http('GET', '/bar/lanes')).rejects.toMatchObject({ code: 'leaving' });
    expect(fetched).toEqual([]);
    holdReads(false);
    await expect(http('GET', '/bar/lanes')).resolves.toEqual({ ok: true });
    expect(fetched).toEqual(['/api/bar/lanes']);
  });
});
