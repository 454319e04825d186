import { baristasBody, closeShiftBody, openShiftBody } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import { parse } from '@server/errors';
import type { Deps } from '@server/deps';
import { mailShiftReport } from './report-mail';
import { closeShift, openShift, setBaristas } from './shifts';
import type { ApiRoute } from '@server/routes';

export function shiftRoutes(deps: Deps): ApiRoute[] {
  return [
    {
      method: 'post',
      path: '/shifts',
      capability: 'runShifts',
      handler: async (req, res) => res.status(201).json({ shift: await openShift(deps, userOf(req), parse(openShiftBody, req.body)) }),
    },
    {
      method: 'post',
      path: '/shifts/current/baristas',
      capability: 'runShifts',
      handler: async (req, res) => res.json({ shift: await setBaristas(deps, userOf(req), parse(baristasBody, req.body).baristasOnBar) }),
    },
    {
      method: 'post',
      path: '/shifts/current/close',
      capability: 'runShifts',
      handler: async (req, res) => {
        const user = userOf(req);
        const shift = await closeShift(deps, user, parse(closeShiftBody, req.body));
        // the owner gets the shift report; a mail problem must not undo the close
        const mailed = await mailShiftReport(deps, user.locationId, shift.id).catch((err: Error) => {
          console.warn(`shift report not mailed: ${err.message}`);
          return false;
        });
        res.json({ shift, mailed });
      },
    },
  ];
}
