// Bean lots as the screens see them: freshness from the café's calendar, stock from the usage
// rows, the run-out estimate and the last good dial-in shot.
import { DEFAULT_LOW_STOCK_G, runsOut, stockState, type BeanLotView, type BeanSettingsView, type Hopper, type UsePoint } from '@/domain/bean-stock';
import { DEFAULT_SHOT_TARGETS, type DialInShotView } from '@/domain/dial-in';
import { brewRatioX10 } from '@/domain/format';
import { freshnessOf } from '@/domain/freshness';
import { bool } from '@server/db/rows';
import { openShiftOf } from '@server/shifts/shifts';
import type { Db } from '@server/db/knex';
import type { Row } from '@server/db/tables';

/** The run-out pace looks back a week of café days; a little more covers a DST change. */
const PACE_LOOKBACK_MS = 9 * 86_400_000;

export async function locationLocale(db: Db, locationId: number): Promise<string> {
  const row = await db('locations').where({ id: locationId }).first('locale');
  return row?.locale ?? 'en-US';
}

export async function loadBeanSettings(db: Db, locationId: number): Promise<BeanSettingsView> {
  const row = await db('bean_settings').where({ location_id: locationId }).first();
  if (!row) return { ...DEFAULT_SHOT_TARGETS, lowStockG: DEFAULT_LOW_STOCK_G };
  return {
    timeMinS: row.time_min_s,
    timeMaxS: row.time_max_s,
    ratioMinX10: row.ratio_min_x10,
    ratioMaxX10: row.ratio_max_x10,
    lowStockG: row.low_stock_g,
  };
}

export function toShotView(r: Row<'dial_in_shots'> & { pulled_by_name: string }): DialInShotView {
  return {
    id: r.id,
    lotId: r.lot_id,
    grind: r.grind,
    doseDg: r.dose_dg,
    yieldDg: r.yield_dg,
    timeDs: r.time_ds,
    ratioX10: brewRatioX10(r.dose_dg, r.yield_dg),
    advice: r.advice,
    good: bool(r.good),
    tasteNote: r.taste_note ?? null,
    pulledBy: r.pulled_by_name,
    pulledAt: r.pulled_at,
  };
}

export const shotsQuery = (db: Db) =>
  db('dial_in_shots').join('users', 'users.id', 'dial_in_shots.pulled_by').select('dial_in_shots.*', 'users.name as pulled_by_name');

export async function lastGoodShot(db: Db, lotId: number): Promise<DialInShotView | null> {
  const row = await shotsQuery(db)
    .where({ 'dial_in_shots.lot_id': lotId, 'dial_in_shots.good': true })
    .orderBy([
      { column: 'dial_in_shots.pulled_at', order: 'desc' },
      { column: 'dial_in_shots.id', order: 'desc' },
    ])
    .first();
  return row ? toShotView(row) : null;
}

interface LotScope {
  locationId: number;
  timeZone: string;
  now: Date;
  includeRetired: boolean;
  lotId?: number;
}

export async function loadLotViews(db: Db, scope: LotScope): Promise<BeanLotView[]> {
  const q = db('bean_lots').where({ location_id: scope.locationId });
  if (!scope.includeRetired) q.whereNull('retired_at');
  if (scope.lotId !== undefined) q.andWhere({ id: scope.lotId });
  const lots = await q.orderByRaw('retired_at IS NOT NULL').orderBy([
    { column: 'roast_date', order: 'desc' },
    { column: 'id', order: 'desc' },
  ]);
  if (lots.length === 0) return [];
  const ids = lots.map((l) => l.id as number);
  const settings = await loadBeanSettings(db, scope.locationId);
  const shift = await openShiftOf(db, scope.locationId);
  const totals: { lot_id: number; used: number | null }[] = await db('bean_usage')
    .whereIn('lot_id', ids)
    .groupBy('lot_id')
    .select('lot_id')
    .sum({ used: 'dose_dg' });
  const since = new Date(scope.now.getTime() - PACE_LOOKBACK_MS).toISOString();
  const recent = await db('bean_usage').whereIn('lot_id', ids).andWhere('used_at', '>=', since).select('lot_id', 'used_at', 'dose_dg');

  const views: BeanLotView[] = [];
  for (const l of lots) {
    const usedDg = Number(totals.find((t) => t.lot_id === l.id)?.used ?? 0);
    const remainingDg = l.received_g * 10 - usedDg;
    const uses: UsePoint[] = recent.filter((u) => u.lot_id === l.id).map((u) => ({ at: u.used_at, doseDg: u.dose_dg }));
    const estimate = runsOut({ remainingDg, uses, now: scope.now, timeZone: scope.timeZone, shiftStart: shift?.openedAt ?? null });
    const fresh = freshnessOf(l.roast_date, scope.now, scope.timeZone, { restDays: l.rest_days, bestUntilDays: l.best_until_days });
    views.push({
      id: l.id,
      name: l.name,
      roaster: l.roaster,
      origin: l.origin ?? null,
      notes: l.notes ?? null,
      roastDate: l.roast_date,
      receivedDate: l.received_date,
      receivedG: l.received_g,
      hopper: l.hopper as Hopper,
      restDays: l.rest_days,
      bestUntilDays: l.best_until_days,
      retiredAt: l.retired_at ?? null,
      daysSinceRoast: fresh.daysSinceRoast,
      freshness: fresh.state,
      usedDg,
      remainingDg,
      runsOut: estimate,
      stock: stockState(remainingDg, estimate, settings.lowStockG),
      lastGood: await lastGoodShot(db, l.id),
    });
  }
  return views;
}
