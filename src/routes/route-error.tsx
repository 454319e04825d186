import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { useHydratedMark } from '@/lib/use-hydrated';

export function RouteError() {
  const error = useRouteError();
  useHydratedMark();
  const status = isRouteErrorResponse(error) ? error.status : 500;
  const message =
    isRouteErrorResponse(error) && typeof error.data?.message === 'string'
      ? error.data.message
      : status === 404
        ? 'There is no screen here.'
        : 'Something went wrong. Reload the page; if it keeps happening, tell the shift lead.';
  return (
    <main className="grid min-h-screen place-items-center bg-steam-50 p-8 text-ink-900">
      <div className="max-w-lg text-center">
        <p className="font-display text-7xl font-semibold">{status}</p>
        <h1 className="mt-2 text-2xl font-semibold">{status === 403 ? 'Not your screen' : 'Cannot show this'}</h1>
        <p className="mt-3 text-lg text-ink-600">{message}</p>
        <p className="mt-6 flex justify-center gap-4 text-lg font-semibold underline">
          <Link to="/">Go to my screen</Link>
          <Link to="/signin">Sign in as someone else</Link>
        </p>
      </div>
    </main>
  );
}
