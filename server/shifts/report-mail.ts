// At close, the owner gets the shift report by e-mail (HTML with a plain-text part).
import type { Deps } from '@server/deps';
import { loadLocation } from '@server/menu/menu';
import { shiftReport, shiftReportEmail } from '@server/reports/index';

export async function mailShiftReport(deps: Deps, locationId: number, shiftId: number): Promise<boolean> {
  if (!deps.mailer) return false;
  const owners = await deps.db('users').where({ location_id: locationId, role: 'owner', active: true }).whereNotNull('email').select('email');
  if (owners.length === 0) return false;
  const location = await loadLocation(deps.db, locationId);
  const report = await shiftReport(deps.db, locationId, shiftId, deps.clock());
  const mail = shiftReportEmail(report, location);
  await deps.mailer.send({ to: owners.map((o) => o.email).join(', '), ...mail, locationId });
  return true;
}
