import type { QueryClient } from '@tanstack/react-query';
import { useQuery, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { LEAD_AND_ADMIN } from '../../../shared/auth/access';
import { Badge } from '../../components/ui/badge';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { bearingsQueryOptions, toShopTable } from '../../features/bearings/api/bearing-queries';
import { engineQueryOptions } from '../../features/drive-library/api/engine-queries';
import { EngineActions } from '../../features/drive-library/components/engine-actions';
import { EngineEditor } from '../../features/drive-library/components/engine-editor';
import { EngineHistory } from '../../features/drive-library/components/engine-history';
import { DEFAULT_PULLEY_OPTIONS, type PulleyOptions } from '../../features/drive-library/lib/draft';
import { shopSettingsQueryOptions } from '../../features/shop-setup/api/shop-settings-queries';
import { EmptyState } from '../../components/ui/states';
import { paths } from '../paths';
import { requireUser } from '../route-guards';
import { enginePath } from './drive-library';
import { CalibrationCard } from '../../features/drive-library/components/calibration-card';

function engineIdOf(raw: string | undefined): number | 'new' {
  if (raw === 'new') return 'new';
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) throw new Response('No such engine', { status: 404 });
  return id;
}

/** Warms the engine and the shop's bearing table (for live defect orders). */
export const engineLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireUser(queryClient, request);
    const id = engineIdOf(params.engineId);
    await Promise.all([
      queryClient.ensureQueryData(bearingsQueryOptions()),
      id === 'new' ? null : queryClient.ensureQueryData(engineQueryOptions(id)),
    ]);
    return null;
  };

/** The shop's pulley unit and diameter offsets; the defaults until Shop setup has answered. */
function usePulleyOptions(): PulleyOptions {
  const { data } = useQuery(shopSettingsQueryOptions());
  return data ? { unit: data.pulleyUnit, groovedOffsetMm: data.groovedOffsetMm, backsideOffsetMm: data.backsideOffsetMm } : DEFAULT_PULLEY_OPTIONS;
}

function NewEngine({ canWrite }: { canWrite: boolean }) {
  const { data: bearings } = useSuspenseQuery(bearingsQueryOptions());
  const navigate = useNavigate();
  const pulley = usePulleyOptions();
  const back = <Link className="text-primary hover:underline" to={paths.driveLibrary}>← Drive library</Link>;
  if (!canWrite) {
    return (
      <>
        <PageHeader title="New engine" description={back} />
        <EmptyState title="Only lead technicians and admins create engines">
          Your role can read every engine in the Drive library. Ask your lead technician to add this engine.
        </EmptyState>
      </>
    );
  }
  return (
    <>
      <PageHeader title="New engine" description={back} />
      <EngineEditor shopTable={toShopTable(bearings.items)} readOnly={false} pulley={pulley} onSaved={(e) => navigate(enginePath(e.id), { replace: true })} />
    </>
  );
}

function ExistingEngine({ id, canWrite }: { id: number; canWrite: boolean }) {
  const { data: engine } = useSuspenseQuery(engineQueryOptions(id));
  const { data: bearings } = useSuspenseQuery(bearingsQueryOptions());
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const pulley = usePulleyOptions();
  return (
    <>
      <PageHeader
        title={engine.name}
        description={(
          <span className="flex flex-wrap items-center gap-2">
            <Link className="text-primary hover:underline" to={paths.driveLibrary}>← Drive library</Link>
            <span className="font-mono tabular-nums">{engine.cylinders} cyl · {engine.firingOrder.join('-')}{engine.idleRpm ? ` · idle ${engine.idleRpm} rpm` : ''}</span>
            {canWrite ? null : <Badge variant="outline">read only</Badge>}
            <span className="text-muted-foreground">version {engine.version}</span>
          </span>
        )}
        actions={<EngineActions engine={engine} canWrite={canWrite} onDuplicated={(copy) => navigate(enginePath(copy.id))} onDeleted={() => navigate(paths.driveLibrary)} />}
      />
      <EngineEditor key={engine.id} engine={engine} shopTable={toShopTable(bearings.items)} readOnly={!canWrite} pulley={pulley}
        onReload={() => void queryClient.invalidateQueries({ queryKey: engineQueryOptions(id).queryKey })} />
      <div className="mt-6">
        <EngineHistory id={engine.id} />
      </div>
      <div className="mt-6"><CalibrationCard engineId={engine.id} canWrite={canWrite} /></div>
    </>
  );
}

/** An engine's page: its fields, belts, accessory-drive table with computed orders, and belt sketch. */
export function EngineRoute() {
  const { data } = useSuspenseQuery(meQueryOptions());
  const id = engineIdOf(useParams().engineId);
  const canWrite = LEAD_AND_ADMIN.includes(data.user.role);
  return id === 'new' ? <NewEngine canWrite={canWrite} /> : <ExistingEngine id={id} canWrite={canWrite} />;
}
