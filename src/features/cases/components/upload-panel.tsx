import { useEffect, useId, useRef, useState, type DragEvent } from 'react';
import { MAX_FILES_PER_UPLOAD, UploadMetadataSchema, type CaptureMetadataInput, type CapturePhase } from '../../../../shared/schemas/captures';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { Input } from '../../../components/ui/input';
import { Label } from '../../../components/ui/label';
import { Select } from '../../../components/ui/select';
import { ErrorState } from '../../../components/ui/states';
import { cn } from '../../../lib/cn';
import { useUploadCaptures } from '../api/use-upload-captures';
import type { PlanItem } from '../lib/capture-plan';
import { BUILT_IN_PRESETS, loadShopPresets, saveShopPreset, type CapturePreset } from '../lib/capture-presets';
import { ProgressBar } from './progress-bar';

interface Pending {
  key: string;
  file: File;
  presetId: string;
  meta: CaptureMetadataInput;
}

function channelSummary(meta: CaptureMetadataInput): string {
  return meta.channels.map((c, i) => `ch ${i + 1} ${c.role}${c.role === 'pickup' ? ` ×${c.scale ?? 1} ${c.unit ?? 'V'}` : ''}`).join(' · ');
}

function fromPreset(preset: CapturePreset, phase: CapturePhase, prefill?: PlanItem['prefill']): CaptureMetadataInput {
  return {
    ...structuredClone(preset.metadata),
    probePoint: { label: prefill?.probePoint?.label ?? '', component: prefill?.probePoint?.component ?? null },
    condition: { speed: 'idle', acClutch: 'unknown', electricalLoad: 'unknown', beltOff: false, ...prefill?.condition },
    phase,
    source: 'upload',
  };
}

/**
 * Drag-and-drop upload of one or several capture files, each with its metadata (the upload
 * contract of docs/api.md) prefilled from a capture preset and the chosen plan item; one progress
 * bar for the upload; a refused file's message says what to do, and "Try again" keeps the files.
 */
export function UploadPanel({ caseId, shopId, components, phase, prefill, onUploaded }: {
  caseId: number;
  shopId: number;
  /** Parts of the case's engine, for "nearest part" of the probe point. */
  components: string[];
  /** before while testing, after_repair once confirmed. */
  phase: CapturePhase;
  prefill?: PlanItem['prefill'] | null;
  onUploaded?: () => void;
}) {
  const id = useId();
  const [shopPresets, setShopPresets] = useState<CapturePreset[]>(() => loadShopPresets(shopId));
  const presets = [...BUILT_IN_PRESETS, ...shopPresets];
  const [pending, setPending] = useState<Pending[]>([]);
  const [problems, setProblems] = useState<Record<number, string>>({});
  const [dragging, setDragging] = useState(false);
  const fileRef = useRef<HTMLInputElement>(null);
  const box = useRef<HTMLDivElement>(null);
  const { state, upload, reset } = useUploadCaptures(caseId);

  useEffect(() => {
    if (!prefill) return;
    box.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
    setPending((list) => list.map((p) => (p.meta.probePoint.label ? p : { ...p, meta: fromPreset(presets.find((x) => x.id === p.presetId) ?? BUILT_IN_PRESETS[0]!, phase, prefill) })));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [prefill]);

  const add = (files: FileList | File[]) => {
    reset();
    const list = Array.from(files).slice(0, MAX_FILES_PER_UPLOAD - pending.length);
    const preset = presets.find((p) => p.id === pending.at(-1)?.presetId) ?? BUILT_IN_PRESETS[0]!;
    setPending((old) => [...old, ...list.map((file) => ({ key: `${file.name}-${file.size}-${Math.random()}`, file, presetId: preset.id, meta: fromPreset(preset, phase, prefill ?? undefined) }))]);
  };
  const update = (key: string, change: (p: Pending) => Pending) => setPending((list) => list.map((p) => (p.key === key ? change(p) : p)));
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    if (e.dataTransfer.files.length > 0) add(e.dataTransfer.files);
  };
  const send = async () => {
    const check = UploadMetadataSchema.safeParse(pending.map((p) => p.meta));
    if (!check.success) {
      const found: Record<number, string> = {};
      for (const issue of check.error.issues) {
        const index = Number(issue.path[0]);
        if (Number.isInteger(index)) found[index] ??= issue.message;
      }
      setProblems(found);
      return;
    }
    setProblems({});
    const done = await upload(pending.map((p) => p.file), pending.map((p) => p.meta));
    if (done) {
      setPending([]);
      onUploaded?.();
    }
  };
  const uploading = state.kind === 'uploading';
  const refusedIndex = state.kind === 'error' ? (state.error.details as { index?: number } | undefined)?.index : undefined;

  return (
    <div ref={box} id="upload" className="scroll-mt-4">
    <Card>
      <CardHeader>
        <CardTitle>{phase === 'after_repair' ? 'Upload the after-repair capture' : 'Upload captures'}</CardTitle>
        <CardDescription>WAV or CSV from the scope or recorder, up to {MAX_FILES_PER_UPLOAD} at once. Say where the probe was for each file.</CardDescription>
      </CardHeader>
      <CardContent className="grid gap-4">
        <div
          onDragOver={(e) => { e.preventDefault(); setDragging(true); }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={cn('flex flex-col items-center gap-2 rounded-lg border-2 border-dashed px-6 py-8 text-center', dragging ? 'border-ring bg-accent' : 'border-border')}
          data-testid="drop-zone"
        >
          <p className="font-medium">Drop capture files here</p>
          <p className="text-sm text-muted-foreground">or</p>
          <Button variant="outline" onClick={() => fileRef.current?.click()} disabled={uploading}>Choose files…</Button>
          <input ref={fileRef} type="file" multiple accept=".wav,.csv,.tsv,.txt,audio/wav,text/csv" className="hidden" aria-label="Capture files"
            onChange={(e) => { if (e.target.files) add(e.target.files); e.target.value = ''; }} />
        </div>
        {pending.length > 0 ? (
          <ul className="grid gap-3" aria-label="Files to upload">
            {pending.map((p, index) => (
              <li key={p.key} className={cn('grid gap-3 rounded-lg border p-3', problems[index] || refusedIndex === index ? 'border-destructive/60' : 'border-border')}>
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <p className="font-mono text-sm font-semibold">{p.file.name} <span className="font-normal text-muted-foreground">{(p.file.size / 1024).toFixed(0)} kB</span></p>
                  <Button variant="ghost" size="sm" onClick={() => setPending((l) => l.filter((x) => x.key !== p.key))} disabled={uploading} aria-label={`Remove ${p.file.name}`}>Remove</Button>
                </div>
                <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
                  <div className="grid gap-1.5 sm:col-span-2">
                    <Label htmlFor={`${id}-${index}-probe`}>Probe point</Label>
                    <Input id={`${id}-${index}-probe`} value={p.meta.probePoint.label} placeholder="e.g. alternator front housing"
                      onChange={(e) => update(p.key, (x) => ({ ...x, meta: { ...x.meta, probePoint: { ...x.meta.probePoint, label: e.target.value } } }))} />
                  </div>
                  <div className="grid gap-1.5">
                    <Label htmlFor={`${id}-${index}-part`}>Nearest part</Label>
                    <Select id={`${id}-${index}-part`} value={p.meta.probePoint.component ?? ''}
                      onChange={(e) => update(p.key, (x) => ({ ...x, meta: { ...x.meta, probePoint: { ...x.meta.probePoint, component: e.target.value || null } } }))}>
                      <option value="">None / not sure</option>
                      {components.map((c) => <option key={c} value={c}>{c}</option>)}
                    </Select>
                  </div>
                  <div className="grid gap-1.5">
                    <Label htmlFor={`${id}-${index}-preset`}>Set-up (preset)</Label>
                    <Select id={`${id}-${index}-preset`} value={p.presetId} onChange={(e) => {
                      const preset = presets.find((x) => x.id === e.target.value)!;
                      update(p.key, (x) => ({ ...x, presetId: preset.id, meta: { ...x.meta, ...structuredClone(preset.metadata) } }));
                    }}>
                      {presets.map((x) => <option key={x.id} value={x.id}>{x.name}</option>)}
                    </Select>
                  </div>
                  <div className="grid gap-1.5">
                    <Label htmlFor={`${id}-${index}-speed`}>Engine speed</Label>
                    <Select id={`${id}-${index}-speed`} value={p.meta.condition?.speed ?? 'idle'}
                      onChange={(e) => update(p.key, (x) => ({ ...x, meta: { ...x.meta, condition: { ...x.meta.condition, speed: e.target.value as 'idle' | 'held', heldRpm: e.target.value === 'held' ? x.meta.condition?.heldRpm ?? 2000 : undefined } } }))}>
                      <option value="idle">Idle</option>
                      <option value="held">Held rpm</option>
                    </Select>
                  </div>
                  {p.meta.condition?.speed === 'held' ? (
                    <div className="grid gap-1.5">
                      <Label htmlFor={`${id}-${index}-rpm`}>Held at (rpm)</Label>
                      <Input id={`${id}-${index}-rpm`} inputMode="numeric" value={p.meta.condition.heldRpm ?? ''}
                        onChange={(e) => update(p.key, (x) => ({ ...x, meta: { ...x.meta, condition: { ...x.meta.condition, heldRpm: Number(e.target.value) || undefined } } }))} />
                    </div>
                  ) : null}
                  <div className="grid gap-1.5">
                    <Label htmlFor={`${id}-${index}-ac`}>A/C clutch</Label>
                    <Select id={`${id}-${index}-ac`} value={p.meta.condition?.acClutch ?? 'unknown'}
                      onChange={(e) => update(p.key, (x) => ({ ...x, meta: { ...x.meta, condition: { ...x.meta.condition, acClutch: e.target.value as 'on' | 'off' | 'unknown' } } }))}>
                      <option value="unknown">Not noted</option><option value="on">On (engaged)</option><option value="off">Off</option>
                    </Select>
                  </div>
                  <label className="flex items-center gap-2 self-end pb-2 text-sm font-medium">
                    <input type="checkbox" className="size-4" checked={p.meta.condition?.beltOff ?? false}
                      onChange={(e) => update(p.key, (x) => ({ ...x, meta: { ...x.meta, condition: { ...x.meta.condition, beltOff: e.target.checked } } }))} />
                    Belt off
                  </label>
                </div>
                <p className="text-xs text-muted-foreground">{channelSummary(p.meta)} · {p.meta.phase === 'after_repair' ? 'after repair' : 'before repair'}</p>
                {problems[index] ? <p className="text-sm font-medium text-destructive">{problems[index]}</p> : null}
              </li>
            ))}
          </ul>
        ) : null}
        {state.kind === 'uploading' ? <ProgressBar label="Uploading" value={state.total > 0 ? (100 * state.loaded) / state.total : 0} /> : null}
        {state.kind === 'error' ? (
          <ErrorState title="The upload was refused; nothing was stored" action={<Button variant="outline" onClick={() => void send()}>Try again</Button>}>
            {state.error.message}
          </ErrorState>
        ) : null}
        {pending.length > 0 ? (
          <div className="flex flex-wrap gap-2">
            <Button onClick={() => void send()} pending={uploading}>Upload {pending.length === 1 ? 'the file' : `${pending.length} files`}</Button>
            <Button variant="outline" disabled={uploading} onClick={() => {
              const name = window.prompt('Name this set-up for the shop (channels, scales, reference):');
              if (name?.trim()) setShopPresets(saveShopPreset(shopId, { name: name.trim(), metadata: { channels: pending[0]!.meta.channels, reference: pending[0]!.meta.reference, sensorKind: pending[0]!.meta.sensorKind } }));
            }}>Save set-up as preset</Button>
          </div>
        ) : null}
      </CardContent>
    </Card>
    </div>
  );
}
