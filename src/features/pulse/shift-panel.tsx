// The lead's shift controls: open with a float, move baristas on and off bar, close with a count.
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { currencySymbol, formatCents, parseAmountToCents } from '@/domain/money';
import { cashDifferenceWords, openTicketsWarning, type OpenTicketsAtClose } from '@/domain/shift-close';
import type { ShiftView } from '@/domain/types';
import { Button } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { pulseKeys } from '@/queries/pulse';

// The forms take dollars and minutes as typed; the API takes cents and seconds.
const amount = z.string().refine((v) => parseAmountToCents(v) !== null, 'Enter an amount like 150 or 150.00');
const openForm = z.object({
  float: amount,
  baristas: z.coerce.number().int().min(1, 'At least 1').max(20),
  targetMinutes: z.coerce.number().min(1).max(60),
});
const closeForm = z.object({ counted: amount, note: z.string().max(200).optional() });

type CloseBody = { countedCashCents: number; note?: string; confirmOpenTickets?: boolean };

/** The API's refusal of a close while tickets are still at the bar, with their count and age. */
function openTicketsOf(error: unknown): OpenTicketsAtClose | null {
  if (!(error instanceof ApiError) || error.code !== 'open_tickets') return null;
  return error.details as unknown as OpenTicketsAtClose;
}

function useShiftCommand<T>(run: (body: T) => Promise<{ shift: ShiftView }>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: () => qc.invalidateQueries({ queryKey: pulseKeys.all }),
  });
}

const input = 'mt-1 w-28 rounded-lg border border-steam-200 bg-white px-3 py-2 text-lg';

export function ShiftPanel({
  shift,
  expectedCashCents,
  currency,
  timeZone,
}: {
  shift: ShiftView | null;
  expectedCashCents: number | null;
  currency: string;
  timeZone: string;
}) {
  const open = useShiftCommand(send.openShift);
  const baristas = useShiftCommand(send.setBaristas);
  const close = useShiftCommand(send.closeShift);
  const openF = useForm({ resolver: zodResolver(openForm), defaultValues: { float: '150.00', baristas: 2, targetMinutes: 4 } });
  const closeF = useForm({ resolver: zodResolver(closeForm), defaultValues: { counted: '', note: '' } });
  const money = (c: number) => formatCents(c, currency);
  const leftOpen = openTicketsOf(close.error);
  const error = [open.error, baristas.error, leftOpen ? null : close.error].find(Boolean);
  const closed = close.data?.shift;
  const [confirming, setConfirming] = useState<CloseBody | null>(null);
  const sign = currencySymbol(currency);

  if (!shift) {
    return (
      <form
        aria-label="Open a shift"
        className="flex flex-wrap items-end gap-4 rounded-2xl border border-steam-200 bg-white p-4"
        onSubmit={openF.handleSubmit((v) =>
          open.mutate({ openingFloatCents: parseAmountToCents(v.float)!, baristasOnBar: v.baristas, waitTargetSeconds: Math.round(v.targetMinutes * 60) }),
        )}
      >
        <h2 className="w-full text-xl font-semibold">No shift open</h2>
        {closed && (
          <p role="status" className="w-full text-lg">
            Last shift closed: expected {money(closed.expectedCashCents ?? 0)}, counted {money(closed.countedCashCents ?? 0)}, difference{' '}
            <strong>{cashDifferenceWords(closed.expectedCashCents ?? 0, closed.countedCashCents ?? 0, currency)}</strong>. The report was mailed to the owner.
          </p>
        )}
        <label>
          Cash float ({sign})
          <input className={input} {...openF.register('float')} />
          <FieldError message={openF.formState.errors.float?.message} />
        </label>
        <label>
          Baristas on bar
          <input className={input} inputMode="numeric" {...openF.register('baristas')} />
        </label>
        <label>
          Wait target (min)
          <input className={input} inputMode="decimal" {...openF.register('targetMinutes')} />
        </label>
        <Button type="submit" size="lg" disabled={open.isPending}>
          Open shift
        </Button>
        {error && (
          <p role="alert" className="w-full font-semibold text-copper-700">
            {error instanceof ApiError ? error.message : 'That did not work'}
          </p>
        )}
      </form>
    );
  }

  return (
    <section aria-label="Shift" className="flex flex-wrap items-end gap-4 rounded-2xl border border-steam-200 bg-white p-4">
      <h2 className="w-full text-xl font-semibold">
        Shift open since {new Date(shift.openedAt).toLocaleTimeString('en-US', { hour: 'numeric', minute: '2-digit', timeZone })} · {shift.openedBy}
      </h2>
      <div className="flex items-center gap-2">
        <span className="text-lg">On bar:</span>
        <Button
          tone="quiet"
          aria-label="One barista fewer"
          disabled={shift.baristasOnBar <= 1 || baristas.isPending}
          onClick={() => baristas.mutate({ baristasOnBar: shift.baristasOnBar - 1 })}
        >
          −
        </Button>
        <strong data-testid="baristas-on-bar" className="w-8 text-center font-display text-3xl">
          {shift.baristasOnBar}
        </strong>
        <Button
          tone="quiet"
          aria-label="One barista more"
          disabled={baristas.isPending}
          onClick={() => baristas.mutate({ baristasOnBar: shift.baristasOnBar + 1 })}
        >
          +
        </Button>
      </div>
      <p className="text-lg">
        Float {money(shift.openingFloatCents)} · cash expected in the drawer now <strong data-testid="expected-cash">{money(expectedCashCents ?? 0)}</strong>
      </p>
      {confirming && leftOpen ? (
        // the bar still has tickets: closing now ends the shift under them, so the lead says so
        <div role="group" aria-label="Tickets still open" className="ml-auto flex flex-wrap items-center gap-3 rounded-xl border-2 border-copper-700 px-4 py-3">
          <p className="text-lg">
            <strong>⚠ {openTicketsWarning(leftOpen)}</strong> Close the shift anyway? They stay on the Bar.
          </p>
          <Button
            size="lg"
            disabled={close.isPending}
            onClick={() => close.mutate({ ...confirming, confirmOpenTickets: true }, { onSuccess: () => setConfirming(null) })}
          >
            Close with {leftOpen.openTickets === 1 ? 'the ticket' : 'tickets'} open
          </Button>
          <Button
            tone="quiet"
            size="lg"
            onClick={() => {
              close.reset();
              setConfirming(null);
            }}
          >
            Back
          </Button>
        </div>
      ) : confirming ? (
        // Closing mails the report and ends the shift for everyone: the lead sees the difference first.
        <div
          role="group"
          aria-label="Confirm closing the shift"
          className="ml-auto flex flex-wrap items-center gap-3 rounded-xl border-2 border-ink-900 px-4 py-3"
        >
          <p className="text-lg">
            Close with {money(confirming.countedCashCents)} counted — expected {money(expectedCashCents ?? 0)}, difference{' '}
            <strong>{cashDifferenceWords(expectedCashCents ?? 0, confirming.countedCashCents, currency)}</strong>?
          </p>
          <Button
            size="lg"
            disabled={close.isPending}
            onClick={() =>
              close.mutate(confirming, {
                onSuccess: () => setConfirming(null),
                // refused for open tickets: stay, and ask about them
                onError: (err) => !openTicketsOf(err) && setConfirming(null),
              })
            }
          >
            Yes, close the shift
          </Button>
          <Button tone="quiet" size="lg" onClick={() => setConfirming(null)}>
            Back
          </Button>
        </div>
      ) : (
        <form
          aria-label="Close the shift"
          className="ml-auto flex flex-wrap items-end gap-3"
          onSubmit={closeF.handleSubmit((v) => setConfirming({ countedCashCents: parseAmountToCents(v.counted)!, note: v.note || undefined }))}
        >
          <label>
            Cash counted ({sign})
            <input className={input} {...closeF.register('counted')} />
            <FieldError message={closeF.formState.errors.counted?.message} />
          </label>
          <label>
            Note
            <input className="mt-1 w-48 max-w-full rounded-lg border border-steam-200 bg-white px-3 py-2 text-lg" {...closeF.register('note')} />
          </label>
          <Button type="submit" size="lg" disabled={close.isPending}>
            Close shift…
          </Button>
        </form>
      )}
      {error && (
        <p role="alert" className="w-full font-semibold text-copper-700">
          {error instanceof ApiError ? error.message : 'That did not work'}
        </p>
      )}
    </section>
  );
}
