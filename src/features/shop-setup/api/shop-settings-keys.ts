/** Query keys of Shop setup (STYLE.md §7). */
export const shopSettingsKeys = {
  all: ['shop-settings'] as const,
  detail: () => [...shopSettingsKeys.all, 'detail'] as const,
};
