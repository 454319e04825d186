// Waits and arrivals per 15 minutes across the shift: two charts on one time line, each with one
// axis (minutes of wait; tickets fired), and a legend in words with each line's own pattern, so no
// series is told by colour alone. Loaded only on the Pulse screen, after hydration, so the chart
// library weighs nothing on the Bar or the Counter.
import { Bar, BarChart, CartesianGrid, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatDuration } from '@/domain/format';
import type { PulseBucket } from '@/domain/pulse';

const INK = '#1d1a17';
const TICK = { fill: INK, fontSize: 14 };
const WAITS = [
  { key: 'median', name: 'half waited under', stroke: INK, dash: undefined, width: 3 },
  { key: 'p90', name: '9 in 10 waited under', stroke: '#8f4d1f', dash: '8 4', width: 3 },
  { key: 'target', name: 'target', stroke: '#5a5047', dash: '2 4', width: 2 },
] as const;

function Legend({ items }: { items: { name: string; stroke: string; dash?: string; width: number; bar?: boolean }[] }) {
  return (
    <ul aria-label="Legend" data-testid="chart-legend" className="mt-1 flex flex-wrap gap-x-5 gap-y-1 text-base text-ink-900">
      {items.map((i) => (
        <li key={i.name} className="flex items-center gap-2">
          <svg width="36" height="14" aria-hidden>
            {i.bar ? (
              <rect x="8" y="1" width="20" height="12" fill={i.stroke} stroke={INK} />
            ) : (
              <line x1="0" y1="7" x2="36" y2="7" stroke={i.stroke} strokeWidth={i.width} strokeDasharray={i.dash} />
            )}
          </svg>
          {i.name}
        </li>
      ))}
    </ul>
  );
}

export default function PulseChart({ buckets, targetSeconds, timeZone }: { buckets: PulseBucket[]; targetSeconds: number; timeZone: string }) {
  const fmt = new Intl.DateTimeFormat('en-US', { hour: 'numeric', minute: '2-digit', timeZone });
  const data = buckets.map((b) => ({
    time: fmt.format(new Date(b.start)),
    arrivals: b.arrivals,
    // minutes for the axis, unrounded so the tooltip can say the wait as it is
    median: b.medianWaitSeconds === null ? null : b.medianWaitSeconds / 60,
    p90: b.p90WaitSeconds === null ? null : b.p90WaitSeconds / 60,
    target: targetSeconds / 60,
  }));
  return (
    <div>
      <p className="text-base font-semibold tracking-widest text-ink-600 uppercase">Waits per 15 min (minutes)</p>
      <div data-testid="waits-chart">
        <ResponsiveContainer width="100%" height={240}>
          <LineChart data={data} margin={{ top: 8, right: 12, bottom: 0, left: -12 }}>
            <CartesianGrid stroke="#e4ddd2" />
            <XAxis dataKey="time" tick={TICK} />
            <YAxis tick={TICK} allowDecimals={false} />
            {/* waits as they are (1:30), not as decimal minutes */}
            <Tooltip formatter={(value) => (typeof value === 'number' ? formatDuration(value * 60) : value)} />
            {WAITS.map((w) => (
              <Line
                key={w.key}
                dataKey={w.key}
                name={w.name}
                stroke={w.stroke}
                strokeWidth={w.width}
                strokeDasharray={w.dash}
                dot={w.key === 'target' ? false : { r: 3 }}
                connectNulls
                isAnimationActive={false}
              />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <Legend items={[...WAITS]} />
      <p className="mt-4 text-base font-semibold tracking-widest text-ink-600 uppercase">Tickets fired per 15 min</p>
      <div data-testid="arrivals-chart">
        <ResponsiveContainer width="100%" height={140}>
          <BarChart data={data} margin={{ top: 8, right: 12, bottom: 0, left: -12 }}>
            <CartesianGrid stroke="#e4ddd2" />
            <XAxis dataKey="time" tick={TICK} />
            <YAxis tick={TICK} allowDecimals={false} />
            <Tooltip />
            <Bar dataKey="arrivals" name="tickets fired" fill="#c8a878" stroke={INK} isAnimationActive={false} />
          </BarChart>
        </ResponsiveContainer>
      </div>
    </div>
  );
}
