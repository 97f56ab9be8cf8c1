import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { ShopSettingsDto, ShopSettingsInput } from '../../../../shared/schemas/shop-settings';
import { api } from '../../../lib/api-client';
import { shopSettingsKeys } from './shop-settings-keys';

/** GET /api/shop/settings: the shop's settings (every signed-in user reads them). */
export const shopSettingsQueryOptions = () =>
  queryOptions({
    queryKey: shopSettingsKeys.detail(),
    queryFn: ({ signal }) => api.get<{ settings: ShopSettingsDto }>('/api/shop/settings', { signal }).then((r) => r.settings),
    staleTime: 60_000,
  });

/** PUT /api/shop/settings (admin); field errors are shown at their inputs. */
export function useSaveShopSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ShopSettingsInput) => api.put<{ settings: ShopSettingsDto }>('/api/shop/settings', body).then((r) => r.settings),
    onSuccess: (settings) => {
      queryClient.setQueryData(shopSettingsKeys.detail(), settings);
    },
    meta: { inlineErrors: true },
  });
}
