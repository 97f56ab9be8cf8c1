import { useSuspenseQuery } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { LEAD_AND_ADMIN } from '../../../shared/auth/access';
import { Card, CardContent } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { EnginesTable } from '../../features/drive-library/components/engines-table';
import { paths } from '../paths';

/** The engine page of one engine (and of a new one). */
export const enginePath = (id: number | 'new') => `${paths.driveLibrary}/${id}`;

/** Drive library: the shop's engines. */
export function DriveLibraryRoute() {
  const { data } = useSuspenseQuery(meQueryOptions());
  const navigate = useNavigate();
  return (
    <>
      <PageHeader title="Drive library" description="Your shop's engines and their accessory drives: belts, effective pulley diameters and bearings." />
      <Card>
        <CardContent className="pt-5">
          <EnginesTable enginePath={enginePath} newEnginePath={enginePath('new')} canWrite={LEAD_AND_ADMIN.includes(data.user.role)}
            onImported={(engine) => navigate(enginePath(engine.id))} />
        </CardContent>
      </Card>
    </>
  );
}
