// The customer's tip, before payment, when the café takes tips (Settings): "No tip", each suggested
// percentage with the amount it gives on this order, and (if the café allows it) an amount the
// customer names. One tap for the usual choices; the amount to pay below updates with it.
import { formatCents } from '@/domain/money';
import { maxTipCents, tipForPercent, type TipSettings } from '@/domain/tips';
import { FieldError } from '@/components/ui/field-error';
import { Segmented } from '@/components/ui/segmented';
import type { TipChoice } from './checkout';

type Option = 'none' | 'custom' | `${number}`;

const optionOf = (tip: TipChoice): Option => (tip.kind === 'percent' ? `${tip.percent}` : tip.kind);

export function TipPicker({
  tips,
  tip,
  tipCents,
  totalCents,
  currency,
  onChange,
}: {
  tips: TipSettings;
  tip: TipChoice;
  /** what the choice gives; null when the typed amount isn't one */
  tipCents: number | null;
  totalCents: number;
  currency: string;
  onChange(tip: TipChoice): void;
}) {
  const money = (c: number) => formatCents(c, currency);
  const options: { value: Option; label: string; hint?: string }[] = [
    { value: 'none', label: 'No tip' },
    ...tips.percents.map((p) => ({ value: `${p}` as Option, label: `${p} %`, hint: money(tipForPercent(totalCents, p)) })),
    ...(tips.custom ? [{ value: 'custom' as const, label: 'Other' }] : []),
  ];
  const choose = (v: Option) =>
    onChange(
      v === 'none'
        ? { kind: 'none' }
        : v === 'custom'
          ? { kind: 'custom', text: tip.kind === 'custom' ? tip.text : '' }
          : { kind: 'percent', percent: Number(v) },
    );
  const tooMuch = tipCents !== null && tipCents > maxTipCents(totalCents);
  return (
    <div data-testid="tip-picker">
      {/* one compact row beside its word, so the cash part stays in view on a 1024×768 tablet */}
      <Segmented compact label="Tip" options={options} value={optionOf(tip)} onChange={choose} />
      {tip.kind === 'custom' && (
        <label className="mt-1 ml-11 flex items-center gap-2 text-base font-semibold">
          Tip amount
          <input
            inputMode="decimal"
            autoComplete="off"
            autoFocus
            placeholder={money(0)}
            aria-invalid={tipCents === null || tooMuch}
            className="w-28 rounded-lg border border-steam-200 px-3 py-2 text-xl font-normal"
            value={tip.text}
            onChange={(e) => onChange({ kind: 'custom', text: e.target.value })}
          />
        </label>
      )}
      <FieldError
        message={tipCents === null ? 'Enter a tip like 2 or 2.50' : tooMuch ? `A tip is at most ${money(maxTipCents(totalCents))} on this order` : undefined}
      />
    </div>
  );
}
