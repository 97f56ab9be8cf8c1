import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { LEAD_AND_ADMIN } from '../../../shared/auth/access';
import { Card, CardContent } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { bearingsQueryOptions } from '../../features/bearings/api/bearing-queries';
import { BearingsTable } from '../../features/bearings/components/bearings-table';
import { requireUser } from '../route-guards';

/** Warms the bearing table. */
export const bearingsLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireUser(queryClient, request);
    await queryClient.ensureQueryData(bearingsQueryOptions());
    return null;
  };

/** Bearings: the shop-editable table of bearings by designation. */
export function BearingsRoute() {
  const { data } = useSuspenseQuery(meQueryOptions());
  return (
    <>
      <PageHeader title="Bearings" description="Bearings by designation: ball count, ball and pitch diameters, contact angle, and where the numbers came from." />
      <Card>
        <CardContent className="pt-5">
          <BearingsTable canWrite={LEAD_AND_ADMIN.includes(data.user.role)} />
        </CardContent>
      </Card>
    </>
  );
}
