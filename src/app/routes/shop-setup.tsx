import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { shopSettingsQueryOptions } from '../../features/shop-setup/api/shop-settings-queries';
import { ShopSettingsForm } from '../../features/shop-setup/components/shop-settings-form';
import { requireSection } from '../route-guards';

/** Admins only; warms the settings. */
export const shopSetupLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireSection(queryClient, request, 'shop-setup');
    await queryClient.ensureQueryData(shopSettingsQueryOptions());
    return null;
  };

/** Shop setup: the shop's own settings. */
export function ShopSetupRoute() {
  const { data } = useSuspenseQuery(shopSettingsQueryOptions());
  const queryClient = useQueryClient();
  return (
    <>
      <PageHeader title="Shop setup" description="Your shop's name and report header, defaults for new cases and analyses, and how pulleys are measured." />
      <ShopSettingsForm settings={data} onSaved={() => void queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey })} />
    </>
  );
}
