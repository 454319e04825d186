// The Reports part of the screens' Api during server rendering: straight to the services.
import { cardCheckQuery } from '@/domain/card-check-schemas';
import { parse } from '@server/errors';
import { reportRangeQuery, ticketHistoryQuery } from '@/domain/schemas';
import type { ReportsApi } from '@/lib/reports-api';
import { cardCheck } from '@server/payments/card-check';
import type { Deps } from '@server/deps';
import { rangeReport, reportShifts, shiftReport, ticketHistory } from '@server/reports';

/** `locationId` throws 401 when nobody is signed in. Input is checked as the HTTP routes check it. */
export function reportsServerApi(deps: Deps, locationId: () => number): ReportsApi {
  return {
    shifts: () => reportShifts(deps.db, locationId(), deps.clock()),
    shift: (id) => shiftReport(deps.db, locationId(), id, deps.clock()),
    range: (from, to) => {
      const q = parse(reportRangeQuery, { from, to }, 'query');
      return rangeReport(deps.db, locationId(), q.from, q.to, deps.clock());
    },
    tickets: (params) => ticketHistory(deps.db, locationId(), parse(ticketHistoryQuery, params, 'query')),
    cardCheck: (date) => cardCheck(deps, locationId(), parse(cardCheckQuery, { date }, 'query').date),
  };
}
