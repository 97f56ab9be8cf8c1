import { useEffect, useId, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { Label } from '../../../components/ui/label';
import { Select } from '../../../components/ui/select';
import { ErrorState } from '../../../components/ui/states';
import { wholePlan, type ListenPlan } from '../lib/listen-plan';

/** One way to play the capture: the whole channel or filtered for a suspect. */
export interface ListenChoice {
  key: string;
  label: string;
  plan: ListenPlan;
}

export interface ListenPanelProps {
  /** URL of the pickup channel as WAV (GET /api/captures/:id/audio). */
  audioUrl: string;
  choices: ListenChoice[];
  /** Called with the playback position (s) while playing, null when stopped. */
  onPlayhead?: (seconds: number | null) => void;
}

type Status = { kind: 'idle' } | { kind: 'loading' } | { kind: 'playing' } | { kind: 'error'; message: string };

/**
 * Listen: plays the pickup channel in the browser through Web Audio, whole or through the chosen
 * suspect's filters (see listen-plan.ts), and reports the playhead for the Speed plot.
 */
export function ListenPanel({ audioUrl, choices, onPlayhead }: ListenPanelProps) {
  const all: ListenChoice[] = [{ key: 'whole', label: 'Whole pickup channel', plan: wholePlan() }, ...choices];
  const [key, setKey] = useState('whole');
  const [status, setStatus] = useState<Status>({ kind: 'idle' });
  const ctxRef = useRef<AudioContext | null>(null);
  const bufferRef = useRef<AudioBuffer | null>(null);
  const sourceRef = useRef<AudioBufferSourceNode | null>(null);
  const frameRef = useRef<number>(0);
  const selectId = useId();
  const choice = all.find((c) => c.key === key) ?? all[0]!;

  const stop = () => {
    cancelAnimationFrame(frameRef.current);
    const src = sourceRef.current;
    sourceRef.current = null;
    if (src) {
      src.onended = null;
      try {
        src.stop();
      } catch {
        // already stopped
      }
    }
    onPlayhead?.(null);
    setStatus((s) => (s.kind === 'playing' ? { kind: 'idle' } : s));
  };

  useEffect(() => () => {
    stop();
    void ctxRef.current?.close();
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  const play = async () => {
    stop();
    try {
      const ctx = (ctxRef.current ??= new AudioContext());
      if (ctx.state === 'suspended') await ctx.resume();
      if (!bufferRef.current) {
        setStatus({ kind: 'loading' });
        const response = await fetch(audioUrl, { credentials: 'same-origin' });
        if (!response.ok) throw new Error(response.status === 409 ? 'The capture file cannot be read for listening.' : `The server answered ${response.status}.`);
        bufferRef.current = await ctx.decodeAudioData(await response.arrayBuffer());
      }
      const source = ctx.createBufferSource();
      source.buffer = bufferRef.current;
      let node: AudioNode = source;
      for (const f of choice.plan.filters) {
        const biquad = ctx.createBiquadFilter();
        biquad.type = f.type;
        biquad.frequency.value = Math.min(f.frequencyHz, ctx.sampleRate / 2 - 1);
        biquad.Q.value = f.q;
        biquad.gain.value = f.gainDb;
        node.connect(biquad);
        node = biquad;
      }
      const gain = ctx.createGain();
      gain.gain.value = choice.plan.outputGain;
      node.connect(gain).connect(ctx.destination);
      const startedAt = ctx.currentTime;
      source.onended = () => stop();
      source.start();
      sourceRef.current = source;
      setStatus({ kind: 'playing' });
      const tick = () => {
        onPlayhead?.(ctx.currentTime - startedAt);
        frameRef.current = requestAnimationFrame(tick);
      };
      tick();
    } catch (error) {
      setStatus({ kind: 'error', message: error instanceof Error ? error.message : 'Playback failed.' });
    }
  };

  return (
    <Card>
      <CardHeader>
        <CardTitle>Listen</CardTitle>
        <CardDescription>
          Play the pickup channel, whole or filtered for a suspect. Keep the volume low at first: a filtered bearing ring can be sharp.
        </CardDescription>
      </CardHeader>
      <CardContent className="grid gap-3">
        <div className="grid gap-1.5 sm:max-w-md">
          <Label htmlFor={selectId}>Play</Label>
          <Select id={selectId} value={key} onChange={(e) => setKey(e.target.value)} disabled={status.kind === 'playing'}>
            {all.map((c) => (
              <option key={c.key} value={c.key}>
                {c.label}
              </option>
            ))}
          </Select>
        </div>
        {choice.plan.notes.length > 0 ? (
          <ul className="grid gap-1 text-sm text-foreground/85" data-testid="listen-notes">
            {choice.plan.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        ) : null}
        <div className="flex gap-2">
          {status.kind === 'playing' ? (
            <Button onClick={stop}>Stop</Button>
          ) : (
            <Button onClick={() => void play()} pending={status.kind === 'loading'}>
              Play
            </Button>
          )}
        </div>
        {status.kind === 'error' ? (
          <ErrorState title="Could not play the capture">{status.message} Try again, or download the capture and play it on the shop computer.</ErrorState>
        ) : null}
      </CardContent>
    </Card>
  );
}
