import type { TimelineEntryDto } from '../../../../shared/schemas/cases';
import { Card, CardContent, CardHeader, CardTitle } from '../../../components/ui/card';
import { when } from '../lib/case-words';

/** The case's timeline, newest first. */
export function TimelineCard({ entries }: { entries: TimelineEntryDto[] }) {
  return (
    <Card>
      <CardHeader><CardTitle>Timeline</CardTitle></CardHeader>
      <CardContent>
        {entries.length === 0 ? <p className="text-sm text-muted-foreground">Nothing yet.</p> : (
          <ol className="grid gap-2" aria-label="Timeline">
            {[...entries].reverse().map((e) => (
              <li key={e.id} className="grid grid-cols-[7.5rem_1fr] gap-3 text-sm">
                <time dateTime={e.at} className="font-mono text-xs tabular-nums text-muted-foreground">{when(e.at)}</time>
                <div>
                  <p>{e.message}</p>
                  {e.note ? <p className="text-muted-foreground">“{e.note}”</p> : null}
                </div>
              </li>
            ))}
          </ol>
        )}
      </CardContent>
    </Card>
  );
}
