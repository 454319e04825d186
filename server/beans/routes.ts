// Bean lots with their freshness and stock (the owner), and the dial-in log (barista and up): the
// handlers of their commands (src/commands.ts).
import type { CommandHandlers } from '@server/commands';
import { createLot, retireLot, saveBeanSettings, updateLot } from './beans';
import { logShot } from './dial-in';

export const beanCommands: CommandHandlers<'createLot' | 'updateLot' | 'retireLot' | 'saveBeanSettings' | 'logShot'> = {
  createLot: async ({ deps, user }, body) => ({ lot: await createLot(deps, user, body) }),
  updateLot: async ({ deps, user, params }, body) => ({ lot: await updateLot(deps, user, params.id, body) }),
  retireLot: async ({ deps, user, params }) => ({ lot: await retireLot(deps, user, params.id) }),
  saveBeanSettings: async ({ deps, user }, body) => ({ settings: await saveBeanSettings(deps, user, body) }),
  logShot: ({ deps, user }, body) => logShot(deps, user, body),
};
