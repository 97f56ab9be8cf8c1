import type { CaseStatus } from '../../../../shared/schemas/cases';

/** Status names as the shop floor says them. */
export const STATUS_LABELS: Record<CaseStatus, string> = {
  open: 'Open', testing: 'Testing', ranked: 'Ranked', confirmed: 'Confirmed', verified: 'Verified', closed: 'Closed',
};

/** Badge variant per status. */
export const STATUS_VARIANTS: Record<CaseStatus, 'default' | 'outline' | 'success' | 'warning' | 'destructive'> = {
  open: 'outline', testing: 'warning', ranked: 'default', confirmed: 'default', verified: 'success', closed: 'outline',
};

/** Fault names in a technician's words. */
export const FAULT_LABELS: Record<string, string> = {
  shaft: 'shaft (imbalance, misalignment)', outer_race: 'bearing outer race', inner_race: 'bearing inner race', ball: 'bearing ball',
  cage: 'bearing cage', belt: 'belt',
};

/** "Alternator · bearing outer race". */
export function suspectName(component: string, fault: string | null): string {
  return fault ? `${component} · ${FAULT_LABELS[fault] ?? fault}` : component;
}

/** Short date and time in the viewer's locale. */
export function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });
}
