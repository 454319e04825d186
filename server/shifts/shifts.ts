// Shifts: the lead opens one with a cash float, the baristas on bar and the wait target, changes
// the bar count as people move, and closes it with a cash count against what the till expects.
import type { SessionUser, ShiftView } from '@/domain/types';
import { openTicketsAt, openTicketsWarning, type OpenTicketsAtClose } from '@/domain/shift-close';
import { conflict, DomainError, notFound } from '@server/domain-errors';
import { isUniqueViolation } from '@server/db/dialect';
import type { Deps } from '@server/deps';
import { appendShiftEvent, runCommand } from '@server/events';
import type { Db } from '@server/db/knex';

type ShiftInput = { openingFloatCents: number; baristasOnBar: number; waitTargetSeconds: number };

export async function loadShift(db: Db, shiftId: number): Promise<ShiftView> {
  const s = await db('shifts')
    .leftJoin('users as o', 'o.id', 'shifts.opened_by')
    .leftJoin('users as c', 'c.id', 'shifts.closed_by')
    .where('shifts.id', shiftId)
    .first('shifts.*', 'o.name as opened_by_name', 'c.name as closed_by_name');
  if (!s) throw notFound('Shift');
  return {
    id: s.id,
    openedAt: s.opened_at,
    openedBy: s.opened_by_name,
    openingFloatCents: s.opening_float_cents,
    baristasOnBar: s.baristas_on_bar,
    waitTargetSeconds: s.wait_target_seconds,
    closedAt: s.closed_at,
    closedBy: s.closed_by_name ?? null,
    expectedCashCents: s.expected_cash_cents,
    countedCashCents: s.counted_cash_cents,
    closeNote: s.close_note ?? null,
  };
}

export async function openShiftOf(db: Db, locationId: number): Promise<ShiftView | null> {
  const row = await db('shifts').where({ location_id: locationId }).whereNull('closed_at').first('id');
  return row ? loadShift(db, row.id) : null;
}

/**
 * What should be in the drawer: the float, plus cash taken for this shift's orders, less cash
 * handed back during the shift (whichever shift the refunded order was taken in).
 */
export async function expectedCash(db: Db, shiftId: number): Promise<number> {
  const shift = await db('shifts').where({ id: shiftId }).first('opening_float_cents', 'location_id', 'opened_at', 'closed_at');
  const taken = await db('payments')
    .join('orders', 'orders.id', 'payments.order_id')
    .where({ 'orders.shift_id': shiftId, 'payments.method': 'cash', 'payments.status': 'succeeded' })
    .sum<{ n: number | null }>({ n: 'payments.amount_cents' })
    .first();
  const refundedQuery = db('refunds')
    .join('payments', 'payments.id', 'refunds.payment_id')
    .join('orders', 'orders.id', 'refunds.order_id')
    .where({ 'orders.location_id': shift.location_id, 'payments.method': 'cash' })
    .andWhere('refunds.created_at', '>=', shift.opened_at);
  if (shift.closed_at) refundedQuery.andWhere('refunds.created_at', '<=', shift.closed_at);
  const refunded = await refundedQuery.sum<{ n: number | null }>({ n: 'refunds.amount_cents' }).first();
  return shift.opening_float_cents + Number(taken?.n ?? 0) - Number(refunded?.n ?? 0);
}

export async function openShift(deps: Deps, user: SessionUser, input: ShiftInput) {
  const alreadyOpen = () => conflict('A shift is already open; close it first');
  try {
    return await insertShift(deps, user, input, alreadyOpen);
  } catch (err) {
    // two leads opening at once: the one-open-shift index refuses the second
    if (isUniqueViolation(err)) throw alreadyOpen();
    throw err;
  }
}

function insertShift(deps: Deps, user: SessionUser, input: ShiftInput, alreadyOpen: () => DomainError) {
  return runCommand(deps, async (trx) => {
    if (await openShiftOf(trx, user.locationId)) throw alreadyOpen();
    const at = deps.clock().toISOString();
    const [{ id }] = await trx('shifts')
      .insert({
        location_id: user.locationId,
        opened_at: at,
        opened_by: user.id,
        opening_float_cents: input.openingFloatCents,
        baristas_on_bar: input.baristasOnBar,
        wait_target_seconds: input.waitTargetSeconds,
      })
      .returning('id');
    // the bar's target and the Counter's quotes follow the shift
    await trx('locations').where({ id: user.locationId }).update({ baristas_on_bar: input.baristasOnBar, wait_target_seconds: input.waitTargetSeconds });
    const shift = await loadShift(trx, id);
    return { result: shift, events: [await appendShiftEvent(trx, user.locationId, shift, at, user.id)] };
  });
}

export function setBaristas(deps: Deps, user: SessionUser, baristasOnBar: number) {
  return runCommand(deps, async (trx) => {
    const open = await openShiftOf(trx, user.locationId);
    if (!open) throw conflict('Open a shift first');
    const at = deps.clock().toISOString();
    await trx('shifts').where({ id: open.id }).update({ baristas_on_bar: baristasOnBar });
    await trx('locations').where({ id: user.locationId }).update({ baristas_on_bar: baristasOnBar });
    const shift = await loadShift(trx, open.id);
    return { result: shift, events: [await appendShiftEvent(trx, user.locationId, shift, at, user.id)] };
  });
}

/** The café's tickets still at the bar (any shift's): how many, and how long the oldest has waited. */
export async function openTicketsNow(db: Db, locationId: number, now: Date): Promise<OpenTicketsAtClose> {
  const rows: { at: string }[] = await db('orders').where({ location_id: locationId, status: 'open' }).select(db.raw('COALESCE(fired_at, created_at) AS at'));
  return openTicketsAt(
    rows.map((r) => r.at),
    now,
  );
}

export function closeShift(deps: Deps, user: SessionUser, input: { countedCashCents: number; note?: string; confirmOpenTickets?: boolean }) {
  return runCommand(deps, async (trx) => {
    const open = await openShiftOf(trx, user.locationId);
    if (!open) throw conflict('No shift is open');
    const now = deps.clock();
    const at = now.toISOString();
    // closing ends the shift for everyone: with tickets still at the bar the lead must say so
    const left = await openTicketsNow(trx, user.locationId, now);
    if (left.openTickets > 0 && !input.confirmOpenTickets) {
      throw conflict(`${openTicketsWarning(left)} Close anyway?`, left, 'open_tickets');
    }
    const closed = await trx('shifts')
      .where({ id: open.id })
      .whereNull('closed_at') // another close may have landed since the read
      .update({
        closed_at: at,
        closed_by: user.id,
        expected_cash_cents: await expectedCash(trx, open.id),
        counted_cash_cents: input.countedCashCents,
        close_note: input.note ?? null,
        open_tickets_at_close: left.openTickets,
        oldest_open_wait_seconds_at_close: left.oldestWaitSeconds,
      });
    if (closed === 0) throw conflict('No shift is open');
    const shift = await loadShift(trx, open.id);
    return { result: shift, events: [await appendShiftEvent(trx, user.locationId, shift, at, user.id)] };
  });
}
