// A shot's numbers as the bar says them: "2.4 · 18.0 g → 36.0 g · 28 s · 1:2.0".
import { formatGrams, formatSeconds, type DialInShotView } from '../../domain/dial-in';
import { formatRatio } from '../../domain/format';

export function shotNumbers(s: Pick<DialInShotView, 'doseDg' | 'yieldDg' | 'timeDs' | 'ratioX10'>) {
  return `${formatGrams(s.doseDg)} → ${formatGrams(s.yieldDg)} · ${formatSeconds(s.timeDs)} · ${formatRatio(s.ratioX10)}`;
}

export const timeOfDay = (iso: string, timeZone: string, locale = 'en-US') =>
  new Intl.DateTimeFormat(locale, { hour: 'numeric', minute: '2-digit', timeZone }).format(new Date(iso));
