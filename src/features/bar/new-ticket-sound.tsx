// The Bar's optional sound for a new ticket, a setting of this screen (kept in this browser): one
// Bar at the machine may chime while a second at the pass stays quiet. Browsers let a page make
// sound only after a tap on it, so a Bar loaded with the sound on asks for one tap; the chime is
// two short tones made in the page (no sound file to load on a wall screen).
import { useEffect, useRef, useState } from 'react';
import { arrivals } from '@/domain/all-day';
import { Button } from '@/components/ui/button';

const STORAGE_KEY = 'jugline.bar.sound';

function chime(context: AudioContext) {
  const start = context.currentTime;
  [880, 1320].forEach((hz, i) => {
    const tone = context.createOscillator();
    const gain = context.createGain();
    tone.frequency.value = hz;
    gain.gain.setValueAtTime(0.0001, start + i * 0.18);
    gain.gain.exponentialRampToValueAtTime(0.3, start + i * 0.18 + 0.02);
    gain.gain.exponentialRampToValueAtTime(0.0001, start + i * 0.18 + 0.16);
    tone.connect(gain).connect(context.destination);
    tone.start(start + i * 0.18);
    tone.stop(start + i * 0.18 + 0.17);
  });
}

/** The sound switch; rings once for each batch of tickets that arrived while it is on. */
export function NewTicketSound({ ticketIds }: { ticketIds: readonly number[] }) {
  const [on, setOn] = useState(false);
  const [blocked, setBlocked] = useState(false);
  const [rings, setRings] = useState(0);
  const context = useRef<AudioContext | null>(null);
  const seen = useRef<Set<number> | null>(null);

  // the setting is this browser's, read after hydration (the server can't know it)
  useEffect(() => {
    if (window.localStorage.getItem(STORAGE_KEY) === 'on') {
      setOn(true);
      context.current = new AudioContext();
      setBlocked(context.current.state !== 'running');
    }
  }, []);

  useEffect(() => {
    const next = arrivals(seen.current, ticketIds);
    seen.current = next.seen;
    if (!on || next.fresh.length === 0 || context.current?.state !== 'running') return;
    chime(context.current);
    setRings((n) => n + 1); // what was rung, for anyone checking the screen
  }, [ticketIds, on]);

  const toggle = async () => {
    if (on && blocked && context.current) {
      // loaded with the sound on: this tap lets it play, it doesn't switch it off
      await context.current.resume();
      setBlocked(context.current.state !== 'running');
      return;
    }
    const next = !on;
    window.localStorage.setItem(STORAGE_KEY, next ? 'on' : 'off');
    setOn(next);
    if (!next) return;
    context.current ??= new AudioContext();
    await context.current.resume(); // this tap is the one the browser waits for
    setBlocked(context.current.state !== 'running');
    chime(context.current); // so the barista hears what a new ticket will sound like
  };

  return (
    <Button tone="dark" aria-pressed={on} data-rings={rings} onClick={() => void toggle()} className="text-lg">
      {on ? (blocked ? 'Sound on · tap to allow' : 'Sound on') : 'Sound off'}
    </Button>
  );
}
