// The standing steam caution, in the café's temperature unit. Temperatures are common practice,
// not a standard; the caution defers to the local food code.
import { useQuery } from '@tanstack/react-query';
import { STEAM, temperatureLabel, type TemperatureUnit } from '../../domain/units';
import { useApi } from '../../lib/api-context';
import { menuQuery } from '../menu/queries';

/** "130 °C" in the chosen unit, the other in brackets where both are wanted. */
export const temp = (c: number, unit: TemperatureUnit, both = false) =>
  both ? `${temperatureLabel(c, unit)} (${temperatureLabel(c, unit === 'C' ? 'F' : 'C')})` : temperatureLabel(c, unit);

/** "55–65 °C" */
export const tempRange = (fromC: number, toC: number, unit: TemperatureUnit) =>
  `${temperatureLabel(fromC, unit).split(' ')[0]}–${temperatureLabel(toC, unit)}`;

export function steamCaution(unit: TemperatureUnit, both = false) {
  return `Caution: steam (about ${temp(STEAM.wandSteamC, unit, both)} at the wand) and milk above about ${temp(STEAM.scaldsAboveC, unit, both)} scald and burn — purge and wipe the wand; follow your local food code.`;
}

/**
 * The Bar's footer line. It reads the unit from the menu (the board snapshot carries none); until
 * the menu has loaded — and on a wall screen without scripts — it gives both units.
 */
export function SteamCaution() {
  const { data: menu } = useQuery(menuQuery(useApi()));
  const unit = menu?.location.temperatureUnit;
  return <span data-testid="steam-caution">{unit ? steamCaution(unit) : steamCaution('C', true)}</span>;
}
