// Opening and closing a shift, and the baristas on bar: the handlers of their commands (src/commands.ts).
import type { CommandHandlers } from '@server/commands';
import { mailShiftReport } from './report-mail';
import { closeShift, openShift, setBaristas } from './shifts';

export const shiftCommands: CommandHandlers<'openShift' | 'setBaristas' | 'closeShift'> = {
  openShift: async ({ deps, user }, body) => ({ shift: await openShift(deps, user, body) }),
  setBaristas: async ({ deps, user }, body) => ({ shift: await setBaristas(deps, user, body.baristasOnBar) }),
  closeShift: async ({ deps, user }, body) => {
    const shift = await closeShift(deps, user, body);
    // the owner gets the shift report; a mail problem must not undo the close
    const mailed = await mailShiftReport(deps, user.locationId, shift.id).catch((err: Error) => {
      console.warn(`shift report not mailed: ${err.message}`);
      return false;
    });
    return { shift, mailed };
  },
};
