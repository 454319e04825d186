// Set a password from an invitation or reset link (/welcome/:token). Open to everyone: the token
// is the proof. A link that can't be used gets one plain page, whatever the reason.
import { zodResolver } from '@hookform/resolvers/zod';
import { useSuspenseQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import type { ReactNode } from 'react';
import { data, isRouteErrorResponse, Link, useParams, useRouteError, type LoaderFunctionArgs } from 'react-router';
import { HOME_SCREEN } from '@/domain/roles';
import { PASSWORD_MAX_BYTES, PASSWORD_MIN_CHARS, setPasswordBody, type SetPasswordBody } from '@/domain/team-schemas';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { welcomeQuery } from '@/queries/team';
import { useApi } from '@/lib/api-context';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { useHydrated } from '@/lib/use-hydrated';
import type { RouteDeps } from './deps';
import { RouteError } from './route-error';

const field = 'mt-1 w-full rounded-lg border border-steam-200 bg-white px-3 py-3 text-lg';

function Card({ children }: { children: ReactNode }) {
  return (
    <main className="grid min-h-screen place-items-center bg-roast-950 p-6">
      <div className="w-full max-w-md rounded-2xl bg-steam-50 p-8 text-ink-900 shadow-xl">
        <p className="font-display text-4xl font-semibold tracking-wide">Jugline</p>
        {children}
      </div>
    </main>
  );
}

function Welcome() {
  const token = useParams().token ?? '';
  const { data: link } = useSuspenseQuery(welcomeQuery(useApi(), token));
  const hydrated = useHydrated();
  const form = useForm<SetPasswordBody>({ resolver: zodResolver(setPasswordBody), defaultValues: { password: '', confirm: '' } });
  const { errors, isSubmitting } = form.formState;
  const invite = link.purpose === 'invite';
  const first = link.name.trim().split(/\s+/)[0];

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      const { user } = await send.acceptLink({ token, ...values });
      // A fresh page as the person (not a client-side move: this screen's data is the used link,
      // and the browser's Back must not lead to it).
      window.location.replace(HOME_SCREEN[user.role]);
    } catch (err) {
      const details = err instanceof ApiError ? (err.details ?? []) : [];
      for (const d of details) if (d.path === 'password' || d.path === 'confirm') form.setError(d.path, { message: d.message });
      if (details.length === 0) form.setError('root', { message: err instanceof ApiError ? err.message : 'Could not set the password' });
    }
  });

  return (
    <Card>
      <h1 className="mt-2 text-2xl font-semibold">{invite ? `Welcome to ${link.locationName}, ${first}` : `Choose a new password, ${first}`}</h1>
      <p className="mt-2 text-lg text-ink-600">
        {link.name} · sign-in name <strong className="text-ink-900">{link.username}</strong>
      </p>
      <form method="post" onSubmit={onSubmit} noValidate className="mt-6">
        <label className="block text-base font-semibold" htmlFor="password">
          {invite ? 'Password' : 'New password'}
        </label>
        <input
          id="password"
          type="password"
          autoComplete="new-password"
          aria-invalid={!!errors.password}
          aria-describedby="password-rules"
          className={field}
          {...form.register('password')}
        />
        <p id="password-rules" className="mt-1 text-base text-ink-600">
          At least {PASSWORD_MIN_CHARS} characters and at most about {PASSWORD_MAX_BYTES} (accented letters count double). A few words you'll remember make a
          good one.
        </p>
        <FieldError message={errors.password?.message} />
        <label className="mt-4 block text-base font-semibold" htmlFor="confirm">
          The same password again
        </label>
        <input id="confirm" type="password" autoComplete="new-password" aria-invalid={!!errors.confirm} className={field} {...form.register('confirm')} />
        <FieldError message={errors.confirm?.message} />
        <FieldError message={errors.root?.message} />
        <Button type="submit" size="lg" className="mt-6 w-full" disabled={!hydrated || isSubmitting}>
          {isSubmitting ? 'Saving…' : 'Set password and sign in'}
        </Button>
      </form>
    </Card>
  );
}

/** Unknown, used, replaced or expired: the same page, so a guess learns nothing. */
function LinkNotValid() {
  const error = useRouteError();
  if (!isRouteErrorResponse(error) || error.status !== 404) return <RouteError />;
  return (
    <Card>
      <h1 className="mt-2 text-2xl font-semibold">This link can't be used</h1>
      <p className="mt-3 text-lg">
        A link to set a password works once and for a limited time, and a newer link replaces an older one. Ask the owner to send you a new link.
      </p>
      <p className="mt-6 text-lg font-semibold underline">
        <Link to="/signin" reloadDocument>
          Go to sign-in
        </Link>
      </p>
    </Card>
  );
}

export const welcomeRoute = (deps: RouteDeps) => ({
  Component: Welcome,
  ErrorBoundary: LinkNotValid,
  handle: { title: 'Set your password' },
  loader: async ({ params }: LoaderFunctionArgs) => {
    try {
      await deps.queryClient.ensureQueryData(welcomeQuery(deps.api, params.token ?? ''));
    } catch (err) {
      const status = (err as { status?: number })?.status;
      if (status === 404 || status === 400) throw data({ message: 'This link cannot be used.' }, { status: 404, statusText: 'Not Found' });
      throw err;
    }
    return null;
  },
});
