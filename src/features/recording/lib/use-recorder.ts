import { useCallback, useEffect, useRef, useState } from 'react';
import { encodeWav } from '../../../../shared/synth/encode-wav';
import { channelLevels, joinBlocks } from './levels';
import { liveRpm, type LiveRpmSetup } from './live-rpm';

/** Web Audio rate asked for: the analysis and the file use 48 kHz (the default would often be 44.1 kHz). */
export const RECORD_RATE_HZ = 48_000;
/** Seconds of input kept for the live meters and the live rpm. */
const LIVE_S = 4;
/** How often the meters and the rpm refresh. */
const TICK_MS = 300;

export type RecorderPhase = 'idle' | 'opening' | 'monitoring' | 'recording' | 'review';

export interface RecorderResult {
  channels: Float32Array[];
  sampleRateHz: number;
  durationS: number;
  wav: Blob;
  rpm: { rpm: number; from: 'reference' | 'pickup' } | null;
}

/** Whether this page may use the microphone or an audio interface at all (a secure context with mediaDevices). */
export function recordingSupport(): { ok: true } | { ok: false; reason: 'insecure' | 'unsupported' } {
  if (typeof window === 'undefined' || !window.isSecureContext) return { ok: false, reason: 'insecure' };
  if (!navigator.mediaDevices?.getUserMedia || typeof AudioWorkletNode === 'undefined') return { ok: false, reason: 'unsupported' };
  return { ok: true };
}

/**
 * The browser recorder: opens the chosen input with every voice processing off (echo
 * cancellation made the two channels identical in a trial), runs it through an AudioWorklet that
 * keeps the channels discrete, shows live levels, clipping and rpm, records N seconds and returns
 * the channels and a 32-bit float WAV.
 */
export function useRecorder(setup: LiveRpmSetup) {
  const [phase, setPhase] = useState<RecorderPhase>('idle');
  const [error, setError] = useState<string | null>(null);
  const [devices, setDevices] = useState<MediaDeviceInfo[]>([]);
  const [deviceId, setDeviceId] = useState<string>('');
  const [channelCount, setChannelCount] = useState(0);
  const [levels, setLevels] = useState<{ peakDbfs: number; clipped: boolean }[]>([]);
  const [clipSeen, setClipSeen] = useState<boolean[]>([]);
  const [rpm, setRpm] = useState<{ rpm: number; from: 'reference' | 'pickup' } | null>(null);
  const [elapsedS, setElapsedS] = useState(0);
  const [result, setResult] = useState<RecorderResult | null>(null);
  const audio = useRef<{ ctx: AudioContext; stream: MediaStream; node: AudioWorkletNode } | null>(null);
  const live = useRef<Float32Array[][]>([]);
  const recorded = useRef<Float32Array[][] | null>(null);
  const target = useRef(0);
  const setupRef = useRef(setup);
  setupRef.current = setup;

  const close = useCallback(async () => {
    const a = audio.current;
    audio.current = null;
    if (!a) return;
    a.node.port.onmessage = null;
    a.stream.getTracks().forEach((t) => t.stop());
    await a.ctx.close().catch(() => undefined);
  }, []);

  const finish = useCallback(async () => {
    const blocks = recorded.current;
    recorded.current = null;
    const a = audio.current;
    if (!blocks || !a) return;
    const n = Math.max(1, blocks[0]?.length ?? 1);
    const channels = blocks.length > 0 ? joinBlocks(blocks, n) : [new Float32Array(0)];
    const sampleRateHz = a.ctx.sampleRate;
    await close();
    const wav = new Blob([encodeWav(channels, sampleRateHz, 'float32') as BlobPart], { type: 'audio/wav' });
    setResult({ channels, sampleRateHz, durationS: channels[0].length / sampleRateHz, wav, rpm: liveRpm(channels, sampleRateHz, setupRef.current) });
    setPhase('review');
  }, [close]);

  const open = useCallback(async (id?: string) => {
    setError(null);
    setPhase('opening');
    await close();
    try {
      const stream = await navigator.mediaDevices.getUserMedia({
        audio: { channelCount: 2, echoCancellation: false, noiseSuppression: false, autoGainControl: false, ...(id ? { deviceId: { exact: id } } : {}) },
      });
      const ctx = new AudioContext({ sampleRate: RECORD_RATE_HZ });
      await ctx.audioWorklet.addModule('/recorder-worklet.js');
      const source = ctx.createMediaStreamSource(stream);
      const node = new AudioWorkletNode(ctx, 'crankwise-recorder', {
        numberOfInputs: 1, numberOfOutputs: 0, channelCount: 2, channelCountMode: 'max', channelInterpretation: 'discrete',
      });
      live.current = [];
      node.port.onmessage = (e: MessageEvent<Float32Array[]>) => {
        const block = e.data;
        live.current.push(block);
        const keep = Math.ceil((LIVE_S * ctx.sampleRate) / block[0].length);
        if (live.current.length > keep) live.current.splice(0, live.current.length - keep);
        if (recorded.current) {
          recorded.current.push(block);
          const have = recorded.current.length * block[0].length;
          if (have >= target.current) void finish();
        }
      };
      source.connect(node);
      audio.current = { ctx, stream, node };
      const track = stream.getAudioTracks()[0];
      setChannelCount(track?.getSettings().channelCount ?? 1);
      setDeviceId(track?.getSettings().deviceId ?? id ?? '');
      setDevices((await navigator.mediaDevices.enumerateDevices()).filter((d) => d.kind === 'audioinput'));
      setClipSeen([]);
      setPhase('monitoring');
    } catch (e) {
      await close();
      const name = (e as Error).name;
      setError(name === 'NotAllowedError'
        ? 'The browser was not allowed to use the audio input. Allow the microphone for this site in the browser settings, then press Connect again.'
        : name === 'NotFoundError'
          ? 'No audio input was found. Connect the USB audio interface (or allow the tablet microphone) and press Connect again.'
          : `The audio input could not be opened (${(e as Error).message}). Check the cable and press Connect again.`);
      setPhase('idle');
    }
  }, [close, finish]);

  // Live meters and rpm while the input is open.
  useEffect(() => {
    if (phase !== 'monitoring' && phase !== 'recording') return;
    const timer = setInterval(() => {
      const a = audio.current;
      if (!a || live.current.length === 0) return;
      const width = live.current[live.current.length - 1].length;
      const blocks = live.current;
      const nch = blocks[blocks.length - 1].length;
      const lastQuarter = blocks.slice(-Math.max(1, Math.round((0.3 * a.ctx.sampleRate) / width)));
      const lv = channelLevels(joinBlocks(lastQuarter, nch));
      setLevels(lv);
      setClipSeen((seen) => lv.map((l, i) => l.clipped || (seen[i] ?? false)));
      setRpm(liveRpm(joinBlocks(blocks, nch), a.ctx.sampleRate, setupRef.current));
      if (recorded.current) setElapsedS((recorded.current.length * width) / a.ctx.sampleRate);
    }, TICK_MS);
    return () => clearInterval(timer);
  }, [phase]);

  useEffect(() => () => { void close(); }, [close]);

  const start = useCallback((seconds: number) => {
    const a = audio.current;
    if (!a) return;
    target.current = Math.round(seconds * a.ctx.sampleRate);
    recorded.current = [];
    setElapsedS(0);
    setClipSeen([]);
    setResult(null);
    setPhase('recording');
  }, []);

  const discard = useCallback(() => { setResult(null); setPhase('idle'); }, []);

  return { phase, error, devices, deviceId, channelCount, levels, clipSeen, rpm, elapsedS, result, open, start, stop: finish, discard };
}
