import { useEffect, useMemo, useRef, useState } from 'react';
import { FormProvider, useFieldArray, useForm, useWatch, type FieldErrors as RhfErrors, type Path } from 'react-hook-form';
import { useBlocker } from 'react-router-dom';
import type { BearingGeometry } from '../../../../shared/drive/bearing-table';
import { computeEngine } from '../../../../shared/drive-io/engine-kinematics';
import type { EngineComputedDto, EngineDetailDto } from '../../../../shared/schemas/engines-api';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { Dialog } from '../../../components/ui/dialog';
import { ApiError } from '../../../lib/api-client';
import { cn } from '../../../lib/cn';
import { useCreateEngine, useUpdateEngine } from '../api/use-engine-mutations';
import {
  checkDraft, documentToDraft, draftToDocument, emptyBelt, emptyComponent, formPathOf, newEngineDraft, DEFAULT_PULLEY_OPTIONS,
  type EngineDraft, type PulleyOptions,
} from '../lib/draft';
import { engineDraftResolver } from '../lib/draft-schema';
import { BEARING_FIELDS } from './bearing-details';
import { BeltSketch } from './belt-sketch';
import { BeltsEditor } from './belts-editor';
import { DriveTable } from './drive-table';
import { EngineFields } from './engine-fields';

export interface EngineEditorProps {
  /** The stored engine; undefined for a new one. */
  engine?: EngineDetailDto;
  shopTable: readonly BearingGeometry[];
  readOnly: boolean;
  /** The shop's pulley unit and measured-diameter offsets (Shop setup). */
  pulley?: PulleyOptions;
  onSaved?: (engine: EngineDetailDto) => void;
  /** Reload the stored engine (after 409 `stale_write`). */
  onReload?: () => void;
}

function safeCompute(draft: EngineDraft, shopTable: readonly BearingGeometry[], pulley: PulleyOptions): EngineComputedDto | null {
  const { doc } = checkDraft(draft, pulley);
  if (!doc) return null;
  try {
    return computeEngine(doc, shopTable);
  } catch {
    return null;
  }
}

/** The form paths in page order, so that a refused save goes to the first field to fix. */
function orderedPaths(draft: EngineDraft): string[] {
  const component = ['name', 'kind', 'belt', 'pulleyMm', 'outsideMm', 'fixedRatio', 'backside', ...BEARING_FIELDS];
  return [
    'name', 'cylinders', 'firingOrder', 'idleRpm', 'notes',
    ...draft.belts.flatMap((_, i) => ['name', 'lengthMm', 'driver', 'driverPulleyMm'].map((f) => `belts.${i}.${f}`)),
    ...draft.components.flatMap((_, i) => component.map((f) => `components.${i}.${f}`)),
  ];
}

function firstError(errors: RhfErrors<EngineDraft>, draft: EngineDraft): { path: string; message: string } | null {
  const at = (path: string): string | undefined => {
    let node: unknown = errors;
    for (const seg of path.split('.')) node = node && typeof node === 'object' ? (node as Record<string, unknown>)[seg] : undefined;
    return node && typeof node === 'object' && typeof (node as { message?: unknown }).message === 'string' ? (node as { message: string }).message : undefined;
  };
  for (const path of orderedPaths(draft)) {
    const message = at(path);
    if (message) return { path, message };
  }
  return null;
}

/**
 * The engine page's body: engine fields, belts, the accessory-drive table with live computed
 * columns, and the belt sketch. The form is react-hook-form with field arrays for belts and parts;
 * its resolver checks with the same drive schema as the server. A refused save (ours or the
 * server's) scrolls to the first field to fix, outlines it and says what to do; a save over
 * someone else's newer version says so and offers to reload; leaving with unsaved edits asks first.
 */
export function EngineEditor({ engine, shopTable, readOnly, pulley = DEFAULT_PULLEY_OPTIONS, onSaved, onReload }: EngineEditorProps) {
  const initial = useMemo(() => (engine ? documentToDraft(engine, pulley.unit) : newEngineDraft()), [engine, pulley.unit]);
  const form = useForm<EngineDraft>({
    defaultValues: initial,
    resolver: engineDraftResolver(pulley),
    mode: 'onSubmit',
    reValidateMode: 'onChange',
    shouldFocusError: false,
  });
  const { control, handleSubmit, reset, setError, setFocus, formState } = form;
  const belts = useFieldArray({ control, name: 'belts', keyName: 'key' });
  const components = useFieldArray({ control, name: 'components', keyName: 'key' });
  const [formError, setFormError] = useState<{ text: string; stale?: boolean } | null>(null);
  const [open, setOpen] = useState<Record<string, boolean>>({});
  const leaving = useRef(false);
  const create = useCreateEngine();
  const update = useUpdateEngine(engine?.id ?? 0);

  // A newer copy arrived (saved, imported, reloaded): show it and start clean.
  const shownVersion = useRef(engine?.version);
  useEffect(() => {
    if (engine && engine.version !== shownVersion.current) {
      shownVersion.current = engine.version;
      reset(documentToDraft(engine, pulley.unit));
      setFormError(null);
    }
  }, [engine, pulley.unit, reset]);

  const values = useWatch({ control }) as EngineDraft;
  const dirty = formState.isDirty;
  const live = useMemo(() => safeCompute(values, shopTable, pulley), [values, shopTable, pulley]);
  const computed = live ?? (dirty ? null : engine?.computed ?? null);
  const componentMap = useMemo(() => (computed ? new Map(computed.components.map((c) => [c.component.toLowerCase(), c])) : null), [computed]);
  const beltMap = useMemo(() => (computed ? new Map(computed.belts.map((b) => [b.belt.toLowerCase(), b])) : null), [computed]);
  const sketchDoc = useMemo(() => draftToDocument(values, pulley).doc, [values, pulley]);

  // Unsaved edits: ask before leaving the page (in the app and when the tab closes).
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && !readOnly && !leaving.current && currentLocation.pathname !== nextLocation.pathname);
  useEffect(() => {
    if (!dirty || readOnly) return undefined;
    const onBeforeUnload = (event: BeforeUnloadEvent) => { event.preventDefault(); };
    window.addEventListener('beforeunload', onBeforeUnload);
    return () => window.removeEventListener('beforeunload', onBeforeUnload);
  }, [dirty, readOnly]);

  /** Opens the row the field sits in (bearing fields live under it), then focuses, scrolls to and outlines it. */
  const goTo = (path: string) => {
    const m = /^components\.(\d+)\.(\w+)$/.exec(path);
    if (m && (BEARING_FIELDS as readonly string[]).includes(m[2])) {
      const key = components.fields[Number(m[1])]?.key;
      if (key) setOpen((o) => ({ ...o, [key]: true }));
    }
    setTimeout(() => {
      try {
        setFocus(path as Path<EngineDraft>, { shouldSelect: false });
      } catch {
        // A field that is not on screen (e.g. a removed row) cannot take focus.
      }
      const el = document.activeElement;
      if (el instanceof HTMLElement && typeof el.scrollIntoView === 'function') el.scrollIntoView({ block: 'center', behavior: 'smooth' });
    }, 0);
  };

  const onInvalid = (errors: RhfErrors<EngineDraft>) => {
    const first = firstError(errors, form.getValues());
    const count = orderedPaths(form.getValues()).filter((p) => {
      let node: unknown = errors;
      for (const seg of p.split('.')) node = node && typeof node === 'object' ? (node as Record<string, unknown>)[seg] : undefined;
      return Boolean(node && typeof node === 'object' && 'message' in node);
    }).length;
    if (first) {
      setFormError({ text: `${count > 1 ? `${count} fields need fixing. ` : ''}First: ${first.message}` });
      goTo(first.path);
    } else setFormError({ text: 'Something on this page needs fixing; look for the fields outlined in red.' });
  };

  const onValid = async (draft: EngineDraft) => {
    setFormError(null);
    const checked = checkDraft(draft, pulley);
    if (!checked.doc) return;
    try {
      const saved = engine
        ? await update.mutateAsync({ ...checked.doc, version: engine.version })
        : await create.mutateAsync(checked.doc);
      leaving.current = !engine;
      shownVersion.current = saved.version;
      reset(documentToDraft(saved, pulley.unit));
      onSaved?.(saved);
    } catch (error) {
      if (error instanceof ApiError && error.code === 'stale_write') {
        setFormError({ text: 'This engine was changed by someone else since you opened it. Reload to see their version, then make your change again.', stale: true });
        return;
      }
      if (error instanceof ApiError && Array.isArray(error.details)) {
        const placed: string[] = [];
        for (const d of error.details as { path?: unknown; message?: unknown }[]) {
          if (typeof d?.path !== 'string' || typeof d.message !== 'string') continue;
          const path = formPathOf(d.path, draft);
          setError(path as Path<EngineDraft>, { type: 'server', message: d.message });
          placed.push(path);
        }
        setFormError({ text: error.message });
        const first = orderedPaths(draft).find((p) => placed.includes(p));
        if (first) goTo(first);
        return;
      }
      setFormError({ text: error instanceof Error ? error.message : 'Saving failed; try again.' });
    }
  };

  const discard = () => {
    reset(initial);
    setFormError(null);
  };

  const crank = values.components?.find((c) => c.kind === 'crankshaft')?.name ?? '';
  const firstBelt = values.belts?.find((b) => b.name.trim())?.name ?? '';
  const pending = create.isPending || update.isPending;
  const unitLabel = pulley.unit === 'inch' ? 'in' : 'mm';
  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={(e) => void handleSubmit(onValid, onInvalid)(e)} className="grid grid-cols-1 gap-6">
        <Card>
          <CardContent className="pt-5">
            <EngineFields readOnly={readOnly} />
          </CardContent>
        </Card>
        <Card>
          <CardHeader className="flex flex-row items-start justify-between gap-4">
            <div>
              <CardTitle>Belts</CardTitle>
              <CardDescription>Each belt's driver and that groove's effective diameter; speed at the idle rpm above.</CardDescription>
            </div>
            {readOnly ? null : <Button type="button" variant="outline" size="sm" onClick={() => belts.append(emptyBelt(crank))}>Add belt</Button>}
          </CardHeader>
          <CardContent className="overflow-x-auto px-0 pb-2">
            <BeltsEditor array={belts} computed={beltMap} readOnly={readOnly} unitLabel={unitLabel} />
          </CardContent>
        </Card>
        <Card>
          <CardHeader className="flex flex-row items-start justify-between gap-4">
            <div>
              <CardTitle>Accessory drive</CardTitle>
              <CardDescription>
                {readOnly ? 'Pulley diameters and bearings of each part. ' : 'Enter the effective pulley diameter, or the outside diameter as measured (converted with the offsets in Shop setup). '}
                Orders are multiples of crank speed: 1× is the part's shaft, then its bearing's defect orders; ≈ marks a bearing estimated by rule of thumb.
              </CardDescription>
            </div>
            {readOnly ? null : <Button type="button" variant="outline" size="sm" onClick={() => components.append(emptyComponent('other', firstBelt))}>Add component</Button>}
          </CardHeader>
          <CardContent className="overflow-x-auto px-0 pb-2">
            <DriveTable array={components} computed={componentMap} readOnly={readOnly} pulley={pulley} open={open}
              onToggle={(key) => setOpen((o) => ({ ...o, [key]: !o[key] }))} />
            {!computed && formState.isSubmitted && !readOnly ? <p className="px-4 pt-2 text-xs text-muted-foreground">Computed columns return once the outlined fields are fixed.</p> : null}
          </CardContent>
        </Card>
        {readOnly ? null : (
          <div className={cn('flex flex-wrap items-center justify-end gap-3 px-1', (dirty || formError) && 'sticky bottom-0 z-10 -mx-1 border-t border-border bg-background/95 py-3 backdrop-blur')}>
            {formError ? (
              <p role="alert" className="mr-auto flex flex-wrap items-center gap-2 text-sm text-destructive">
                {formError.text}
                {formError.stale && onReload ? <Button type="button" size="sm" variant="outline" onClick={() => { reset(initial); setFormError(null); onReload(); }}>Reload</Button> : null}
              </p>
            ) : dirty ? <p className="mr-auto text-sm text-muted-foreground">Unsaved changes</p> : null}
            <Button type="button" variant="outline" onClick={discard} disabled={!dirty}>Discard changes</Button>
            <Button type="submit" pending={pending} disabled={!dirty && Boolean(engine)}>{engine ? 'Save engine' : 'Create engine'}</Button>
          </div>
        )}
        <Card>
          <CardHeader>
            <CardTitle>Belt layout</CardTitle>
            <CardDescription>Drawn from the tables above.</CardDescription>
          </CardHeader>
          <CardContent>
            <BeltSketch doc={sketchDoc} />
          </CardContent>
        </Card>
      </form>
      <Dialog open={blocker.state === 'blocked'} onClose={() => blocker.reset?.()} title="Leave without saving?"
        description="Your changes to this engine are not saved. Leave the page and lose them, or stay and save."
        footer={(
          <>
            <Button type="button" variant="outline" onClick={() => blocker.reset?.()}>Stay on this page</Button>
            <Button type="button" variant="destructive" onClick={() => blocker.proceed?.()}>Leave and lose changes</Button>
          </>
        )} />
    </FormProvider>
  );
}
