// Inside a server process the bench starts (Jugline's or the floor's): its event-loop delay and
// memory, asked for over the IPC channel fork() opens — no port, nothing for anyone else to reach.
import { monitorEventLoopDelay } from 'node:perf_hooks';

export interface ProbeReading {
  /** Event-loop delay since the last reset, ms (perf_hooks.monitorEventLoopDelay, 10 ms resolution). */
  loop: { p50: number; p99: number; max: number; mean: number };
  /** CPU time the process has used so far, ms (user + system): unlike wall times, barely moved by other load. */
  cpuMs: number;
  rss: number;
  heapUsed: number;
  external: number;
}

export type ProbeRequest = { probe: number; reset?: boolean; gc?: boolean } | { stop: true };

export function serveProbe(stop: () => Promise<void>) {
  const loop = monitorEventLoopDelay({ resolution: 10 });
  loop.enable();
  const ms = (ns: number) => ns / 1e6;
  process.on('message', (m: ProbeRequest) => {
    if ('stop' in m) {
      loop.disable();
      stop().then(() => process.exit(0));
      return;
    }
    if (m.gc) (globalThis as { gc?: () => void }).gc?.();
    const mem = process.memoryUsage();
    const reading: ProbeReading = {
      loop: { p50: ms(loop.percentile(50)), p99: ms(loop.percentile(99)), max: ms(loop.max), mean: ms(loop.mean) },
      cpuMs: (process.cpuUsage().user + process.cpuUsage().system) / 1000,
      rss: mem.rss,
      heapUsed: mem.heapUsed,
      external: mem.external, // includes ArrayBuffers (socket buffers)
    };
    if (m.reset) loop.reset();
    process.send?.({ probe: m.probe, reading });
  });
}
