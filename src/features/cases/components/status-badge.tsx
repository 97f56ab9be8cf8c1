import type { CaseStatus } from '../../../../shared/schemas/cases';
import { Badge } from '../../../components/ui/badge';
import { STATUS_LABELS, STATUS_VARIANTS } from '../lib/case-words';

/** The case status as a badge. */
export function StatusBadge({ status }: { status: CaseStatus }) {
  return <Badge variant={STATUS_VARIANTS[status]} className="text-sm">{STATUS_LABELS[status]}</Badge>;
}
