// 86ing an item from the floor: the handler of its command (src/commands.ts). GET /menu, what the
// Counter and the Bar read, is in src/reads.ts.
import type { CommandHandlers } from '@server/commands';
import { setItemAvailability } from './availability';

export const menuCommands: CommandHandlers<'setAvailability'> = {
  setAvailability: async ({ deps, user, params }, { available }) => ({ item: await setItemAvailability(deps, user, params.id, available) }),
};
