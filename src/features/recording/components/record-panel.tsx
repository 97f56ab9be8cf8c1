import { useEffect, useMemo, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardFooter, CardHeader, CardTitle } from '../../../components/ui/card';
import { Input } from '../../../components/ui/input';
import { Label } from '../../../components/ui/label';
import { Select } from '../../../components/ui/select';
import { Caution } from '../../../components/ui/states';
import type { RefKind } from '../../../../shared/schemas/analysis-settings';
import { recordingSupport, useRecorder } from '../lib/use-recorder';
import { buildRecordingMetadata, type RecordingMetadata } from '../lib/recording-metadata';

export interface RecordPanelProps {
  engine: { cylinders: number; idleRpm?: number | null };
  /** Sends the WAV and its metadata through the upload path (source: recording). */
  onUpload: (file: File, metadata: RecordingMetadata) => Promise<void>;
}

const METER_FLOOR_DB = -60;

function Meter({ label, tone, level, clipped }: { label: string; tone: 'reference' | 'pickup'; level: number | undefined; clipped: boolean }) {
  const db = level === undefined || !Number.isFinite(level) ? METER_FLOOR_DB : Math.max(METER_FLOOR_DB, level);
  const width = `${Math.round(100 * (1 - db / METER_FLOOR_DB))}%`;
  return (
    <div className="space-y-1" data-testid={`meter-${tone}`}>
      <div className="flex items-baseline justify-between text-sm">
        <span className="font-medium">{label}</span>
        <span className="font-mono tabular-nums" aria-label={`${label} level`}>{level === undefined || !Number.isFinite(level) ? '—' : `${level.toFixed(1)} dBFS`}</span>
      </div>
      <div className="h-3 overflow-hidden rounded bg-muted" role="meter" aria-label={`${label} level`} aria-valuemin={METER_FLOOR_DB} aria-valuemax={0} aria-valuenow={Math.round(db)}>
        <div className={tone === 'reference' ? 'h-full bg-chart-reference' : 'h-full bg-chart-pickup'} style={{ width }} />
      </div>
      {clipped ? <p role="alert" className="text-sm font-medium text-warning-foreground">{label} clipped: turn that input’s gain down (or the attenuator up) and record again.</p> : null}
    </div>
  );
}

/**
 * Record in the browser (issue 20 item 1): choose the input, watch both channels' levels, clipping
 * and the live rpm, record N seconds, review, upload as a WAV through the same path as a file
 * (source: recording). Input 1 carries the ignition clamp (through its attenuator), input 2 the
 * contact pickup; a one-channel input (a tablet microphone) is kept as airborne sound.
 */
export function RecordPanel({ engine, onUpload }: RecordPanelProps) {
  const support = recordingSupport();
  const [refKind, setRefKind] = useState<RefKind | 'none'>('cyl1');
  const [seconds, setSeconds] = useState(10);
  const [probe, setProbe] = useState('');
  const [upload, setUpload] = useState<{ state: 'idle' | 'sending' | 'done' | 'failed'; message?: string }>({ state: 'idle' });
  const rec = useRecorder({ cylinders: engine.cylinders, idleRpm: engine.idleRpm ?? null, refKind: refKind === 'none' ? null : refKind });
  const oneChannel = rec.phase !== 'idle' && rec.phase !== 'opening' && rec.channelCount < 2;
  const reviewUrl = useMemo(() => (rec.result ? URL.createObjectURL(rec.result.wav) : null), [rec.result]);
  useEffect(() => () => { if (reviewUrl) URL.revokeObjectURL(reviewUrl); }, [reviewUrl]);

  if (!support.ok) {
    return (
      <Caution title={support.reason === 'insecure' ? 'Recording needs a secure page' : 'This browser cannot record here'}>
        {support.reason === 'insecure'
          ? <>Browsers allow audio inputs only on https:// pages (or on this computer at http://127.0.0.1). Open Crankwise through its https:// address; whoever runs the server can turn on HTTPS with TLS_CERT_FILE and TLS_KEY_FILE or an HTTPS reverse proxy (README, “Recording in the browser”). You can still upload a file recorded elsewhere.</>
          : <>Use a current Chrome, Edge, Firefox or Safari; you can still upload a file recorded elsewhere.</>}
      </Caution>
    );
  }

  const send = async () => {
    if (!rec.result) return;
    setUpload({ state: 'sending' });
    const metadata = buildRecordingMetadata({ channels: rec.result.channels.length, reference: refKind === 'none' ? null : refKind, probe: probe.trim() || 'recorded in the browser' });
    const stamp = new Date().toISOString().replace(/[:.]/g, '-').slice(0, 19);
    try {
      await onUpload(new File([rec.result.wav], `recording-${stamp}.wav`, { type: 'audio/wav' }), metadata);
      setUpload({ state: 'done', message: 'Uploaded: the capture is analysed like a file upload.' });
    } catch (e) {
      setUpload({ state: 'failed', message: `${(e as Error).message} The recording is still here: try Upload again.` });
    }
  };

  const liveRpm = rec.rpm;
  return (
    <Card>
      <CardHeader>
        <CardTitle>Record</CardTitle>
        <CardDescription>Input 1: the ignition clamp through its attenuator. Input 2: the contact pickup. Levels, clipping and engine speed show while you record.</CardDescription>
      </CardHeader>
      <CardContent className="space-y-5">
        {rec.error ? <p role="alert" className="text-sm text-destructive">{rec.error}</p> : null}
        <div className="grid gap-4 sm:grid-cols-3">
          <div className="space-y-1">
            <Label htmlFor="rec-device">Input device</Label>
            <Select id="rec-device" value={rec.deviceId} disabled={rec.devices.length === 0 || rec.phase === 'recording'} onChange={(e) => void rec.open(e.target.value)}>
              {rec.devices.length === 0 ? <option value="">Connect to list the inputs</option> : null}
              {rec.devices.map((d, i) => <option key={d.deviceId || i} value={d.deviceId}>{d.label || `Input ${i + 1}`}</option>)}
            </Select>
          </div>
          <div className="space-y-1">
            <Label htmlFor="rec-ref">Reference on input 1</Label>
            <Select id="rec-ref" value={refKind} disabled={rec.phase === 'recording'} onChange={(e) => setRefKind(e.target.value as RefKind | 'none')}>
              <option value="cyl1">Clamp on cylinder 1 (1 pulse per cycle)</option>
              <option value="per-rev">Wasted spark (1 per revolution)</option>
              <option value="per-cylinder">Every cylinder (coil primary)</option>
              <option value="none">No reference (speed from the noise)</option>
            </Select>
          </div>
          <div className="space-y-1">
            <Label htmlFor="rec-probe">Probe point</Label>
            <Input id="rec-probe" value={probe} maxLength={100} placeholder="e.g. alternator front housing" onChange={(e) => setProbe(e.target.value)} />
          </div>
        </div>

        {rec.phase === 'idle' || rec.phase === 'opening' ? (
          <Button onClick={() => void rec.open()} pending={rec.phase === 'opening'}>Connect input</Button>
        ) : null}

        {rec.phase === 'monitoring' || rec.phase === 'recording' ? (
          <div className="space-y-4">
            {oneChannel ? (
              <Caution title="One channel only">
                This input gives one channel. For a reference and a pickup, connect a two-input USB audio interface: the ignition clamp through
                its attenuator on input 1, the contact pickup on input 2. A one-channel recording (the tablet’s microphone held near the noise)
                is kept as airborne sound, weaker evidence than a contact pickup, with the speed read from the noise itself.
              </Caution>
            ) : null}
            <Meter label={oneChannel ? 'Input 1 · microphone' : 'Input 1 · reference'} tone={oneChannel ? 'pickup' : 'reference'} level={rec.levels[0]?.peakDbfs} clipped={rec.clipSeen[0] ?? false} />
            {!oneChannel ? <Meter label="Input 2 · pickup" tone="pickup" level={rec.levels[1]?.peakDbfs} clipped={rec.clipSeen[1] ?? false} /> : null}
            <p className="text-sm text-muted-foreground">
              Engine speed{' '}
              <span className="font-mono text-3xl font-semibold tabular-nums text-foreground" data-testid="live-rpm">{liveRpm ? liveRpm.rpm.toFixed(0) : '—'}</span>{' '}
              rpm {liveRpm ? (liveRpm.from === 'reference' ? 'from the reference' : 'read from the pickup') : '(no speed readable yet: check the clamp)'}
            </p>
            <div className="flex flex-wrap items-end gap-3">
              <div className="space-y-1">
                <Label htmlFor="rec-seconds">Seconds</Label>
                <Input id="rec-seconds" type="number" min={3} max={120} value={seconds} className="w-24" disabled={rec.phase === 'recording'} onChange={(e) => setSeconds(Math.min(120, Math.max(3, Number(e.target.value) || 10)))} />
              </div>
              {rec.phase === 'monitoring'
                ? <Button onClick={() => rec.start(seconds)}>Record {seconds} s</Button>
                : <Button variant="outline" onClick={() => void rec.stop()}>Stop ({rec.elapsedS.toFixed(0)} / {seconds} s)</Button>}
            </div>
          </div>
        ) : null}

        {rec.phase === 'review' && rec.result ? (
          <div className="space-y-3" aria-label="Review">
            <p className="text-sm">
              Recorded <span className="font-mono tabular-nums">{rec.result.durationS.toFixed(1)}</span> s,{' '}
              {rec.result.channels.length} channel{rec.result.channels.length === 1 ? '' : 's'} at {(rec.result.sampleRateHz / 1000).toFixed(1)} kHz
              {rec.result.rpm ? <>, <span className="font-mono tabular-nums" data-testid="review-rpm">{rec.result.rpm.rpm.toFixed(0)}</span> rpm {rec.result.rpm.from === 'reference' ? 'from the reference' : 'read from the pickup'}</> : ', no speed readable'}
              .
            </p>
            {reviewUrl ? <audio controls src={reviewUrl} className="w-full" aria-label="Listen to the recording" /> : null}
            {upload.message ? <p role={upload.state === 'failed' ? 'alert' : 'status'} className={upload.state === 'failed' ? 'text-sm text-destructive' : 'text-sm'}>{upload.message}</p> : null}
          </div>
        ) : null}
      </CardContent>
      {rec.phase === 'review' ? (
        <CardFooter>
          <Button onClick={() => void send()} pending={upload.state === 'sending'} disabled={upload.state === 'done'}>Upload to the case</Button>
          <Button variant="ghost" onClick={() => { setUpload({ state: 'idle' }); rec.discard(); }}>Discard and record again</Button>
        </CardFooter>
      ) : null}
    </Card>
  );
}
