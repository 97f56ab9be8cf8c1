import { Button } from './button';

/** "from–to of total" with Previous / Next, for server-paged tables; hidden when there is nothing to page. */
export function Pager({ page, pageSize, total, onPage }: { page: number; pageSize: number; total: number; onPage: (page: number) => void }) {
  if (total <= 0) return null;
  const from = (page - 1) * pageSize + 1;
  const to = Math.min(total, page * pageSize);
  return (
    <div className="flex items-center justify-end gap-3 text-sm text-muted-foreground">
      <span className="font-mono tabular-nums">{from}–{to} of {total}</span>
      <Button variant="outline" size="sm" disabled={page <= 1} onClick={() => onPage(page - 1)}>Previous</Button>
      <Button variant="outline" size="sm" disabled={to >= total} onClick={() => onPage(page + 1)}>Next</Button>
    </div>
  );
}
