import { useMemo, useState } from 'react';
import type { BearingGeometry } from '../../../../shared/drive/bearing-table';
import { computeEngine } from '../../../../shared/drive-io/engine-kinematics';
import type { EngineComputedDto, EngineDetailDto } from '../../../../shared/schemas/engines-api';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { ApiError } from '../../../lib/api-client';
import { cn } from '../../../lib/cn';
import { useCreateEngine, useUpdateEngine } from '../api/use-engine-mutations';
import {
  checkDraft, documentToDraft, draftToDocument, emptyBelt, emptyComponent, errorsFromDetails, newEngineDraft,
  type DraftBelt, type DraftComponent, type EngineDraft, type FieldErrors,
} from '../lib/draft';
import { BeltSketch } from './belt-sketch';
import { BeltsEditor } from './belts-editor';
import { DriveTable } from './drive-table';
import { EngineFields } from './engine-fields';

export interface EngineEditorProps {
  /** The stored engine; undefined for a new one. */
  engine?: EngineDetailDto;
  shopTable: readonly BearingGeometry[];
  readOnly: boolean;
  onSaved?: (engine: EngineDetailDto) => void;
}

function safeCompute(draft: EngineDraft, shopTable: readonly BearingGeometry[]): { computed: EngineComputedDto | null; errors: FieldErrors } {
  const { doc, errors } = checkDraft(draft);
  if (!doc) return { computed: null, errors };
  try {
    return { computed: computeEngine(doc, shopTable), errors };
  } catch {
    return { computed: null, errors };
  }
}

/**
 * The engine page's body: engine fields, belts, the accessory-drive table with live computed
 * columns, and the belt sketch. Edits stay in a draft until saved; the client checks with the
 * same drive schema as the server, and the server's field errors land at the same cells.
 */
export function EngineEditor({ engine, shopTable, readOnly, onSaved }: EngineEditorProps) {
  const [draft, setDraft] = useState<EngineDraft>(() => (engine ? documentToDraft(engine) : newEngineDraft()));
  const [base, setBase] = useState(engine);
  const [serverErrors, setServerErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [showErrors, setShowErrors] = useState(false);
  const [dirty, setDirty] = useState(false);
  const create = useCreateEngine();
  const update = useUpdateEngine(engine?.id ?? 0);
  if (engine !== base) {
    // A newer copy arrived (saved, imported): show it.
    setBase(engine);
    if (engine) setDraft(documentToDraft(engine));
    setDirty(false);
  }

  const live = useMemo(() => safeCompute(draft, shopTable), [draft, shopTable]);
  const computed = live.computed ?? (dirty ? null : engine?.computed ?? null);
  const errors: FieldErrors = { ...(showErrors ? live.errors : {}), ...serverErrors };
  const componentMap = useMemo(() => (computed ? new Map(computed.components.map((c) => [c.component.toLowerCase(), c])) : null), [computed]);
  const beltMap = useMemo(() => (computed ? new Map(computed.belts.map((b) => [b.belt.toLowerCase(), b])) : null), [computed]);
  const sketchDoc = useMemo(() => draftToDocument(draft).doc, [draft]);

  const edit = (next: EngineDraft) => {
    setDraft(next);
    setDirty(true);
    setServerErrors({});
  };
  const patchComponent = (i: number, patch: Partial<DraftComponent>) => edit({ ...draft, components: draft.components.map((c, j) => (j === i ? { ...c, ...patch } : c)) });
  const patchBelt = (i: number, patch: Partial<DraftBelt>) => {
    const old = draft.belts[i];
    // Renaming a belt carries its riders along.
    const components = patch.name !== undefined ? draft.components.map((c) => (c.belt === old.name ? { ...c, belt: patch.name! } : c)) : draft.components;
    edit({ ...draft, components, belts: draft.belts.map((b, j) => (j === i ? { ...b, ...patch } : b)) });
  };

  const save = async () => {
    setShowErrors(true);
    setFormError(null);
    const checked = checkDraft(draft);
    if (!checked.doc) {
      setFormError(`Fix the ${Object.keys(checked.errors).length} highlighted field(s) before saving.`);
      return;
    }
    try {
      const saved = engine ? await update.mutateAsync(checked.doc) : await create.mutateAsync(checked.doc);
      setShowErrors(false);
      setDirty(false);
      onSaved?.(saved);
    } catch (error) {
      if (error instanceof ApiError) {
        setServerErrors(errorsFromDetails(error.details));
        setFormError(error.message);
      } else setFormError('Saving failed; try again.');
    }
  };

  const discard = () => {
    setDraft(engine ? documentToDraft(engine) : newEngineDraft());
    setServerErrors({});
    setShowErrors(false);
    setFormError(null);
    setDirty(false);
  };

  const crank = draft.components.find((c) => c.kind === 'crankshaft')?.name ?? '';
  const firstBelt = draft.belts[0]?.name ?? '';
  return (
    <div className="grid grid-cols-1 gap-6">
      <Card>
        <CardContent className="pt-5">
          <EngineFields draft={draft} errors={errors} readOnly={readOnly} onChange={(patch) => edit({ ...draft, ...patch })} />
        </CardContent>
      </Card>
      <Card>
        <CardHeader className="flex flex-row items-start justify-between gap-4">
          <div>
            <CardTitle>Belts</CardTitle>
            <CardDescription>Each belt's driver and that groove's effective diameter; speed at the idle rpm above.</CardDescription>
          </div>
          {readOnly ? null : <Button variant="outline" size="sm" onClick={() => edit({ ...draft, belts: [...draft.belts, emptyBelt(crank)] })}>Add belt</Button>}
        </CardHeader>
        <CardContent className="px-0 pb-2">
          <BeltsEditor belts={draft.belts} components={draft.components} errors={errors} computed={beltMap} readOnly={readOnly}
            onChange={patchBelt} onRemove={(i) => edit({ ...draft, belts: draft.belts.filter((_, j) => j !== i) })} />
        </CardContent>
      </Card>
      <Card>
        <CardHeader className="flex flex-row items-start justify-between gap-4">
          <div>
            <CardTitle>Accessory drive</CardTitle>
            <CardDescription>
              Effective (pitch-line) pulley diameters. Orders are multiples of crank speed: 1× is the part's shaft, then its bearing's
              defect orders; ≈ marks a bearing estimated by rule of thumb.
            </CardDescription>
          </div>
          {readOnly ? null : <Button variant="outline" size="sm" onClick={() => edit({ ...draft, components: [...draft.components, emptyComponent('other', firstBelt)] })}>Add component</Button>}
        </CardHeader>
        <CardContent className="px-0 pb-2">
          <DriveTable rows={draft.components} belts={draft.belts} errors={errors} computed={componentMap} readOnly={readOnly}
            onChange={patchComponent} onRemove={(i) => edit({ ...draft, components: draft.components.filter((_, j) => j !== i) })} />
          {errors.components ? <p className="px-4 pt-2 text-sm text-destructive">{errors.components}</p> : null}
          {!computed && showErrors ? <p className="px-4 pt-2 text-xs text-muted-foreground">Computed columns return once the highlighted fields are fixed.</p> : null}
        </CardContent>
      </Card>
      {readOnly ? null : (
        <div className={cn('flex flex-wrap items-center justify-end gap-3 px-1', dirty && 'sticky bottom-0 z-10 -mx-1 border-t border-border bg-background/95 py-3 backdrop-blur')}>
          {formError ? <p role="alert" className="mr-auto text-sm text-destructive">{formError}</p> : dirty ? <p className="mr-auto text-sm text-muted-foreground">Unsaved changes</p> : null}
          <Button variant="outline" onClick={discard} disabled={!dirty}>Discard changes</Button>
          <Button onClick={save} pending={create.isPending || update.isPending} disabled={!dirty && Boolean(engine)}>{engine ? 'Save engine' : 'Create engine'}</Button>
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
    </div>
  );
}
