// Waits and arrivals per 15 minutes across the shift. Loaded only on the Pulse screen, after
// hydration, so the chart library weighs nothing on the Bar or the Counter.
import { Bar, CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatDuration } from '../../domain/format';
import type { PulseBucket } from '../../domain/pulse';

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
    <ResponsiveContainer width="100%" height={280}>
      <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 8, left: 0 }}>
        <CartesianGrid stroke="#e4ddd2" />
        <XAxis dataKey="time" />
        <YAxis yAxisId="min" label={{ value: 'wait (min)', angle: -90, position: 'insideLeft' }} />
        <YAxis yAxisId="n" orientation="right" allowDecimals={false} label={{ value: 'tickets', angle: 90, position: 'insideRight' }} />
        {/* waits as they are (1:30), not as decimal minutes */}
        <Tooltip formatter={(value, name) => (name === 'tickets fired' || typeof value !== 'number' ? value : formatDuration(value * 60))} />
        <Legend />
        <Bar yAxisId="n" dataKey="arrivals" name="tickets fired" fill="#e6cfa8" />
        <Line yAxisId="min" dataKey="median" name="median wait" stroke="#1d1a17" strokeWidth={2} dot={{ r: 3 }} connectNulls />
        <Line yAxisId="min" dataKey="p90" name="90th percentile" stroke="#8f4d1f" strokeWidth={2} strokeDasharray="6 3" dot={{ r: 3 }} connectNulls />
        <Line yAxisId="min" dataKey="target" name="target" stroke="#5a5047" strokeDasharray="2 4" dot={false} />
      </ComposedChart>
    </ResponsiveContainer>
  );
}
