import { useQuery } from '@tanstack/react-query';
import type { EngineChange } from '../../../../shared/drive-io/engine-diff';
import { COLUMN_LABELS } from '../../../../shared/drive-io/component-table';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { engineHistoryQueryOptions } from '../api/engine-queries';

const ACTIONS = { create: 'created', update: 'saved', import: 'imported a CSV', duplicate: 'created as a copy' } as const;
const label = (field: string) => COLUMN_LABELS[field] ?? field;
const value = (v: string) => (v === '' ? '—' : v);

/** One change as a line a person reads: "Alternator: Pulley diameter 56 → 58". */
export function describeChange(c: EngineChange): string {
  const what = c.target === 'engine' ? 'Engine' : `${c.target === 'belt' ? 'Belt' : 'Part'} "${c.name}"`;
  if (!('fields' in c)) return `${what} ${c.change}`;
  return `${what}: ${c.fields.map((f) => `${label(f.field)} ${value(f.before)} → ${value(f.after)}`).join('; ')}`;
}

/** The engine's edit history: each save, who made it and what changed (before → after). */
export function EngineHistory({ id }: { id: number }) {
  const { data, isPending, isError } = useQuery(engineHistoryQueryOptions(id));
  return (
    <Card>
      <CardHeader>
        <CardTitle>Edit history</CardTitle>
        <CardDescription>Every save of this engine: who changed what.</CardDescription>
      </CardHeader>
      <CardContent>
        {isPending ? <p className="text-sm text-muted-foreground">Loading the history…</p> : isError ? (
          <p className="text-sm text-destructive">The history could not be loaded; reload the page to try again.</p>
        ) : data.length === 0 ? <p className="text-sm text-muted-foreground">No saves recorded yet.</p> : (
          <ol className="grid gap-3" aria-label="Edit history">
            {data.map((r) => (
              <li key={r.version} className="border-l-2 border-border pl-3">
                <p className="text-sm"><span className="font-medium">{r.userName}</span> {ACTIONS[r.action]} · version {r.version} ·{' '}
                  <time dateTime={r.at} className="text-muted-foreground">{new Date(r.at).toLocaleString()}</time></p>
                {r.action === 'create' || r.action === 'duplicate' ? null : (
                  <ul className="mt-1 grid gap-0.5 text-xs text-muted-foreground">
                    {r.changes.length === 0 ? <li>no change</li> : r.changes.slice(0, 20).map((c, i) => <li key={i}>{describeChange(c)}</li>)}
                    {r.changes.length > 20 ? <li>… and {r.changes.length - 20} more</li> : null}
                  </ul>
                )}
              </li>
            ))}
          </ol>
        )}
      </CardContent>
    </Card>
  );
}
