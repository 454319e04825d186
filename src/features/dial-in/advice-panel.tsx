// What the last shot says to do next, in large type with a sign beside the words.
import type { AdviceCode, ShotAdvice } from '@/domain/dial-in';
import { formatRatio } from '@/domain/format';
import { cn } from '@/lib/cn';

const SIGN: Record<AdviceCode, string> = { dose: '⚖', fast: '»', slow: '«', 'ratio-short': '⇥', 'ratio-long': '⇤', good: '✓' };

export function AdvicePanel({ advice }: { advice: ShotAdvice | null }) {
  return (
    <section aria-label="Advice" aria-live="polite" className="rounded-2xl border-2 border-ink-900 bg-white p-5">
      {advice ? (
        <div data-testid="advice" data-code={advice.code}>
          <p className="flex items-center gap-4 text-3xl font-semibold">
            <span aria-hidden className="font-display text-5xl">
              {SIGN[advice.code]}
            </span>
            <span className={cn(advice.good && 'underline decoration-copper-700 decoration-4 underline-offset-8')}>{advice.headline}</span>
          </p>
          <p className="mt-2 text-xl">
            Ratio <strong>{formatRatio(advice.ratioX10)}</strong> · {advice.detail}
          </p>
          {advice.good && <p className="mt-1 text-lg font-semibold">Marked a good shot: the Bar shows these settings.</p>}
        </div>
      ) : (
        <p className="text-xl text-ink-600">Pull a shot, weigh it, and log it: the advice shows here.</p>
      )}
    </section>
  );
}
