import { useMemo, useState } from 'react';
import { planCapture, type CapturePlan } from '../../../../shared/analysis/capture-plan';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';

const FIELDS = [
  ['idleRpm', 'Idle speed (rpm)', 'The slowest speed recorded'],
  ['heldRpm', 'Highest speed (rpm)', 'A held rpm, if you will raise it'],
  ['cylinders', 'Cylinders', ''],
  ['highestOrder', 'Highest order of interest', "e.g. 3 × a bearing's outer-race order"],
  ['envelopeTopHz', 'Envelope band top (Hz)', 'Default from the analysis settings'],
  ['revolutions', 'Revolutions wanted', 'Sets the order resolution'],
] as const;

type Key = (typeof FIELDS)[number][0];

function Figure({ label, value, unit }: { label: string; value: string; unit: string }) {
  return (
    <div className="grid gap-0.5">
      <dt className="text-xs font-medium text-muted-foreground">{label}</dt>
      <dd className="font-mono text-2xl font-semibold tabular-nums">{value}<span className="ml-1 text-sm font-normal text-muted-foreground">{unit}</span></dd>
    </div>
  );
}

const ms = (s: number) => (s * 1000 >= 100 ? (s * 1000).toFixed(0) : (s * 1000).toFixed(1));

/**
 * The capture planner: the technician's engine speeds and what they look for in, the recording's
 * length, scope setting, sample rate and order resolution out, with the working shown.
 */
export function CapturePlannerForm({ envelopeTopHz }: { envelopeTopHz: number }) {
  const [values, setValues] = useState<Record<Key, string>>({
    idleRpm: '750', heldRpm: '2000', cylinders: '4', highestOrder: '30', envelopeTopHz: String(envelopeTopHz), revolutions: '32',
  });
  const result = useMemo((): { plan: CapturePlan } | { error: string } => {
    const n = Object.fromEntries(Object.entries(values).map(([k, v]) => [k, Number(v.replace(',', '.'))])) as Record<Key, number>;
    try {
      return { plan: planCapture(n) };
    } catch (error) {
      return { error: error instanceof Error ? error.message : 'Check the numbers' };
    }
  }, [values]);
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_1fr]">
      <Card>
        <CardHeader>
          <CardTitle>The engine and what you look for</CardTitle>
        </CardHeader>
        <CardContent className="grid gap-3">
          {FIELDS.map(([key, label, hint]) => (
            <Field key={key} label={label} hint={hint || undefined} inputMode="decimal" className="font-mono" value={values[key]}
              onChange={(e) => setValues((v) => ({ ...v, [key]: e.target.value }))} />
          ))}
        </CardContent>
      </Card>
      <Card>
        <CardHeader>
          <CardTitle>Set the recorder to</CardTitle>
          <CardDescription>Recomputed as you type.</CardDescription>
        </CardHeader>
        <CardContent>
          {'error' in result ? <p role="alert" className="text-sm text-destructive">{result.error}</p> : (
            <div className="grid gap-5">
              <dl className="grid grid-cols-2 gap-4 sm:grid-cols-4" aria-label="Capture settings">
                <Figure label="Record at least" value={result.plan.windowS.toFixed(2)} unit="s" />
                <Figure label="Scope, 10 divisions" value={ms(result.plan.perDivisionS)} unit="ms/div" />
                <Figure label="Sample rate" value={(result.plan.sampleRateHz / 1000).toFixed(result.plan.sampleRateHz % 1000 ? 2 : 0)} unit="kHz" />
                <Figure label="Order resolution" value={result.plan.orderResolution.toPrecision(3)} unit="order" />
              </dl>
              <div>
                <h3 className="text-sm font-semibold">Why</h3>
                <ol className="mt-2 list-decimal space-y-1.5 pl-5 text-sm leading-relaxed text-muted-foreground">
                  {result.plan.reasoning.map((r) => <li key={r}>{r}</li>)}
                </ol>
                <p className="mt-3 text-xs text-muted-foreground">
                  Rules of thumb marked as common practice are what analysers and scope users customarily do, not a standard.
                  A 200 ms screen (20 ms/div) holds one full engine cycle at 600 rpm and more at any higher idle.
                </p>
              </div>
            </div>
          )}
        </CardContent>
      </Card>
    </div>
  );
}
