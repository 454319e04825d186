// The Bar's standing caution line, in the café's temperature unit (wording: src/domain/cautions.ts).
import { useQuery } from '@tanstack/react-query';
import { barCaution } from '@/domain/cautions';
import { useApi } from '@/lib/api-context';
import { menuQuery } from '@/queries/menu';

/**
 * It reads the unit from the menu (the board snapshot carries none); until the menu has loaded —
 * and on a wall screen without scripts — it gives both units.
 */
export function SteamCaution() {
  const { data: menu } = useQuery(menuQuery(useApi()));
  const unit = menu?.location.temperatureUnit;
  return <span data-testid="steam-caution">{unit ? barCaution(unit) : barCaution('C', true)}</span>;
}
