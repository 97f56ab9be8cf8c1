import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import type { PlanItem } from '../lib/capture-plan';

/** The capture plan checklist: each item ticked when a capture covers it; "Record this" prefills an upload. */
export function CapturePlanCard({ items, onUse, canUpload }: { items: PlanItem[]; onUse: (item: PlanItem) => void; canUpload: boolean }) {
  const done = items.filter((i) => i.done).length;
  return (
    <Card>
      <CardHeader>
        <CardTitle>Capture plan <span className="ml-1 font-mono text-sm font-normal text-muted-foreground">{done} of {items.length} covered</span></CardTitle>
        <CardDescription>Suggested from the engine's drive. Record with the engine running only where your shop's rules allow, hands and leads clear of the belt.</CardDescription>
      </CardHeader>
      <CardContent>
        <ul className="grid gap-1.5" aria-label="Capture plan">
          {items.map((item) => (
            <li key={item.key} className="flex items-start gap-3 rounded-md px-2 py-1.5 hover:bg-muted/50">
              <span aria-hidden className={item.done ? 'mt-0.5 text-success' : 'mt-0.5 text-muted-foreground'}>{item.done ? '✔' : '○'}</span>
              <div className="min-w-0 flex-1">
                <p className={item.done ? 'font-medium' : 'font-medium text-foreground'}>
                  {item.label}
                  <span className="sr-only">{item.done ? ' (covered)' : ' (not yet)'}</span>
                </p>
                <p className="text-sm text-muted-foreground">{item.why}</p>
              </div>
              {canUpload && !item.done ? <Button variant="outline" size="sm" onClick={() => onUse(item)}>Record this</Button> : null}
            </li>
          ))}
        </ul>
      </CardContent>
    </Card>
  );
}
