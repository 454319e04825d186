// The location's settings: name, money, tax, units, wait target, pitchers, allergen list. The
// handlers of their commands (src/commands.ts); each answers the whole settings page.
import type { CommandHandlers } from '@server/commands';
import { addPitcher, removePitcher, updatePitcher, updateSettings } from './settings';

export const settingsCommands: CommandHandlers<'updateSettings' | 'addPitcher' | 'updatePitcher' | 'removePitcher'> = {
  updateSettings: ({ deps, user }, body) => updateSettings(deps, user, body),
  addPitcher: ({ deps, user }, body) => addPitcher(deps, user, body),
  updatePitcher: ({ deps, user, params }, body) => updatePitcher(deps, user, params.id, body),
  removePitcher: ({ deps, user, params }) => removePitcher(deps, user, params.id),
};
