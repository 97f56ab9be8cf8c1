import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { LEAD_AND_ADMIN } from '../../../shared/auth/access';
import { Badge } from '../../components/ui/badge';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { bearingsQueryOptions, toShopTable } from '../../features/bearings/api/bearing-queries';
import { engineQueryOptions } from '../../features/drive-library/api/engine-queries';
import { EngineActions } from '../../features/drive-library/components/engine-actions';
import { EngineEditor } from '../../features/drive-library/components/engine-editor';
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

function NewEngine({ canWrite }: { canWrite: boolean }) {
  const { data: bearings } = useSuspenseQuery(bearingsQueryOptions());
  const navigate = useNavigate();
  return (
    <>
      <PageHeader title="New engine" description={<Link className="text-primary hover:underline" to={paths.driveLibrary}>← Drive library</Link>} />
      <EngineEditor shopTable={toShopTable(bearings.items)} readOnly={!canWrite} onSaved={(e) => navigate(enginePath(e.id), { replace: true })} />
    </>
  );
}

function ExistingEngine({ id, canWrite }: { id: number; canWrite: boolean }) {
  const { data: engine } = useSuspenseQuery(engineQueryOptions(id));
  const { data: bearings } = useSuspenseQuery(bearingsQueryOptions());
  const navigate = useNavigate();
  return (
    <>
      <PageHeader
        title={engine.name}
        description={(
          <span className="flex flex-wrap items-center gap-2">
            <Link className="text-primary hover:underline" to={paths.driveLibrary}>← Drive library</Link>
            <span className="font-mono tabular-nums">{engine.cylinders} cyl · {engine.firingOrder.join('-')}{engine.idleRpm ? ` · idle ${engine.idleRpm} rpm` : ''}</span>
            {canWrite ? null : <Badge variant="outline">read only</Badge>}
          </span>
        )}
        actions={<EngineActions engine={engine} canWrite={canWrite} onDuplicated={(copy) => navigate(enginePath(copy.id))} onDeleted={() => navigate(paths.driveLibrary)} />}
      />
      <EngineEditor key={engine.id} engine={engine} shopTable={toShopTable(bearings.items)} readOnly={!canWrite} />
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
