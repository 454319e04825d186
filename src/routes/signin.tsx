import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { useNavigate, useSearchParams } from 'react-router';
import { HOME_SCREEN } from '@/domain/roles';
import { signInBody, type SignInBody } from '@/domain/schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { sessionQuery } from '@/queries/session';
import { useApi } from '@/lib/api-context';
import type { PublicUser } from '@/domain/types';
import { ApiError, http } from '@/lib/http';
import { useHydrated } from '@/lib/use-hydrated';
import type { RouteDeps } from './deps';

/** Only paths on this site, so a crafted ?next= can't send someone elsewhere. */
export function safeNext(next: string | null): string | null {
  // '//host' and '/\\host' both leave the site in browsers
  return next && next.startsWith('/') && !next.startsWith('//') && !next.includes('\\') ? next : null;
}

function SignIn() {
  const qc = useQueryClient();
  const api = useApi();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const form = useForm<SignInBody>({ resolver: zodResolver(signInBody), defaultValues: { username: '', password: '' } });
  const { errors, isSubmitting } = form.formState;
  const hydrated = useHydrated();

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      // a plain route, not a command (src/commands.ts): passport answers it after the throttle's turn
      const { user } = await http<{ user: PublicUser }>('POST', '/session', values);
      qc.clear();
      // the whole session (the café in view, an owner's group), not just the person: a screen
      // reading the cached session must not find half of it
      await qc.fetchQuery(sessionQuery(api));
      navigate(safeNext(params.get('next')) ?? HOME_SCREEN[user.role], { replace: true });
    } catch (err) {
      form.setError('root', { message: err instanceof ApiError ? err.message : 'Could not sign in' });
    }
  });

  return (
    <main className="grid min-h-screen place-items-center bg-roast-950 p-6">
      <form method="post" onSubmit={onSubmit} noValidate className="w-full max-w-sm rounded-2xl bg-steam-50 p-8 text-ink-900 shadow-xl">
        <p className="font-display text-4xl font-semibold tracking-wide">Jugline</p>
        <h1 className="mt-1 text-lg text-ink-600">Sign in to your station</h1>
        <label className="mt-6 block text-base font-semibold" htmlFor="username">
          Sign-in name
        </label>
        <input
          id="username"
          autoComplete="username"
          autoCapitalize="none"
          className="mt-1 w-full rounded-lg border border-steam-200 bg-white px-3 py-3 text-lg"
          aria-invalid={!!errors.username}
          {...form.register('username')}
        />
        <FieldError message={errors.username?.message} />
        <label className="mt-4 block text-base font-semibold" htmlFor="password">
          Password
        </label>
        <input
          id="password"
          type="password"
          autoComplete="current-password"
          className="mt-1 w-full rounded-lg border border-steam-200 bg-white px-3 py-3 text-lg"
          aria-invalid={!!errors.password}
          {...form.register('password')}
        />
        <FieldError message={errors.password?.message} />
        <FieldError message={errors.root?.message} />
        <Button type="submit" size="lg" className="mt-6 w-full" disabled={!hydrated || isSubmitting}>
          {isSubmitting ? 'Signing in…' : 'Sign in'}
        </Button>
      </form>
    </main>
  );
}

export const signInRoute = (_deps: RouteDeps) => ({ Component: SignIn, handle: { title: 'Sign in' } });
