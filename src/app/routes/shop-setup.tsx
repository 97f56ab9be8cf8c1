import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { requireSection } from '../route-guards';
import { NavIcon } from '../nav-icons';
import { PlaceholderPage } from './placeholder';

/** Admins only. */
export const shopSetupLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireSection(queryClient, request, 'shop-setup');
    return null;
  };

/** Shop setup: the shop's own settings. */
export function ShopSetupRoute() {
  return (
    <PlaceholderPage
      icon={<NavIcon section="shop-setup" className="size-10" />}
      title="Shop setup"
      description="Your shop's name and its defaults for new cases and captures."
      emptyTitle="No shop settings to change yet"
    >
      Shop-wide defaults will be set here: the usual reference kind and channels, pickup sensitivity and units, and the report's
      letterhead. Users and roles are managed on the Team page.
    </PlaceholderPage>
  );
}
