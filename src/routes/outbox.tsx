// The Outbox: the mail Jugline sent in the demo, as the local SMTP fake caught it — so a receipt
// can be shown to a customer or checked by the lead without any outside mail service.
import { useSuspenseQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import type { OutboxMail } from '@/domain/outbox';
import { outboxQuery } from '@/queries/outbox';
import { useApi } from '@/lib/api-context';
import { cn } from '@/lib/cn';
import { requireScreen, type RouteDeps } from './deps';
import { SCREENS } from '@/domain/screens';

type Format = (iso: string) => string;

function When({ iso, format }: { iso: string; format: Format }) {
  // Node's and the browser's ICU may space "9:05 AM" differently; the instant is the same.
  return (
    <time dateTime={iso} suppressHydrationWarning>
      {format(iso)}
    </time>
  );
}

function MailRow({ mail, selected, format }: { mail: OutboxMail; selected: boolean; format: Format }) {
  return (
    <li>
      <Link
        to={`?mail=${mail.id}`}
        preventScrollReset
        aria-current={selected ? 'true' : undefined}
        data-testid="outbox-mail"
        className={cn('block rounded-lg border-l-8 px-4 py-3', selected ? 'border-ink-900 bg-steam-200' : 'border-transparent bg-white hover:bg-steam-100')}
      >
        <span className="line-clamp-2 text-lg font-semibold">{mail.subject || '(no subject)'}</span>
        <span className="block truncate text-base text-ink-600" title={mail.to.join(', ')}>
          To {mail.to.join(', ')}
        </span>
        <span className="block text-sm text-ink-600">
          <When iso={mail.receivedAt} format={format} />
        </span>
      </Link>
    </li>
  );
}

function MailPanel({ mail, format }: { mail: OutboxMail; format: Format }) {
  const fields: [string, ReactNode][] = [
    ['From', mail.from],
    ['To', mail.to.join(', ')],
    ['Received', <When key="w" iso={mail.receivedAt} format={format} />],
  ];
  return (
    <article aria-labelledby="mail-subject" className="min-w-0 overflow-auto rounded-xl border border-steam-200 bg-white p-6">
      <h2 id="mail-subject" className="text-2xl font-semibold">
        {mail.subject || '(no subject)'}
      </h2>
      <dl className="mt-3 grid grid-cols-[6rem_1fr] gap-x-4 gap-y-1 text-base">
        {fields.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="font-semibold text-ink-600">{label}</dt>
            <dd className="break-words">{value}</dd>
          </div>
        ))}
      </dl>
      <pre
        data-testid="outbox-text"
        className="mt-5 border-t border-steam-200 pt-5 font-sans text-lg leading-relaxed whitespace-pre-wrap [overflow-wrap:anywhere]"
      >
        {mail.text}
      </pre>
      {mail.html && (
        <details className="mt-5 border-t border-steam-200 pt-4">
          <summary className="cursor-pointer text-base font-semibold">As the customer's mail app shows it (HTML)</summary>
          {/* sandbox="": the mail's HTML may not run scripts, submit forms or reach this page */}
          <iframe title="HTML version of the mail" sandbox="" srcDoc={mail.html} className="mt-3 h-[36rem] w-full rounded-lg border border-steam-200" />
        </details>
      )}
    </article>
  );
}

function Outbox() {
  const { data } = useSuspenseQuery(outboxQuery(useApi()));
  const [params] = useSearchParams();
  const wanted = Number(params.get('mail'));
  const selected = data.mails.find((m) => m.id === wanted) ?? data.mails[0];
  const formatter = new Intl.DateTimeFormat(data.locale, { dateStyle: 'medium', timeStyle: 'short', timeZone: data.timeZone });
  const format: Format = (iso) => formatter.format(new Date(iso));

  return (
    <div className="flex min-h-screen flex-col bg-steam-50 text-ink-900">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 border-b border-steam-200 px-5 py-3">
        <h1 className="text-2xl font-semibold">Outbox</h1>
        <span className="text-lg text-ink-600">
          {data.mails.length} mail{data.mails.length === 1 ? '' : 's'}
        </span>
        <Link to="/" className="ml-auto text-lg font-semibold underline">
          Back to my screen
        </Link>
      </header>
      <p role="note" className="mx-5 mt-4 rounded-lg border border-steam-200 bg-steam-100 px-4 py-3 text-lg">
        Mail sent by Jugline in this demo is caught here; nothing leaves this machine.
      </p>
      {/* side by side from a tablet up; on a phone the list (a short scroll of its own) over the mail */}
      {selected ? (
        <div className="grid min-h-0 flex-1 grid-cols-1 gap-4 p-5 md:grid-cols-[minmax(16rem,26rem)_1fr]">
          <nav aria-label="Caught mail" className="max-h-[40vh] min-h-0 overflow-auto md:max-h-none">
            <ul className="flex flex-col gap-2">
              {data.mails.map((m) => (
                <MailRow key={m.id} mail={m} selected={m.id === selected.id} format={format} />
              ))}
            </ul>
          </nav>
          <MailPanel mail={selected} format={format} />
        </div>
      ) : (
        <p className="m-auto max-w-md p-8 text-center text-xl text-ink-600">No mail yet. Send a receipt from the Counter and it shows up here.</p>
      )}
    </div>
  );
}

export const outboxRoute = (deps: RouteDeps) => ({
  Component: Outbox,
  handle: { title: 'Outbox' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.outbox.need);
    await deps.queryClient.ensureQueryData(outboxQuery(deps.api));
    return null;
  },
});
