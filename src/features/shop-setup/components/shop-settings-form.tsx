import { useState, type FormEvent } from 'react';
import { OFFSET_BASIS } from '../../../../shared/drive/measured-diameter';
import { AnalysisSettingsSchema } from '../../../../shared/schemas/analysis-settings';
import { ShopSettingsSchema, type ShopSettingsDto } from '../../../../shared/schemas/shop-settings';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { Label } from '../../../components/ui/label';
import { Select } from '../../../components/ui/select';
import { toast } from '../../../components/ui/toast';
import { formErrorsFrom } from '../../../lib/form';
import { useSaveShopSettings } from '../api/shop-settings-queries';

type Values = Record<string, string>;

const DEFAULTS = AnalysisSettingsSchema.parse({});

function toValues(s: ShopSettingsDto): Values {
  const band = s.analysisDefaults.envelopeBand;
  return {
    name: s.name, address: s.address, phone: s.phone, defaultLeadId: s.defaultLeadId === null ? '' : String(s.defaultLeadId),
    serviceAdvisorEmail: s.serviceAdvisorEmail, bandAuto: band === 'auto' ? 'yes' : 'no',
    bandLoHz: band === 'auto' ? '' : String(band[0]), bandHiHz: band === 'auto' ? '' : String(band[1]),
    envelopeMaxHz: String(s.analysisDefaults.envelopeMaxHz), samplesPerRev: String(s.analysisDefaults.samplesPerRev),
    revsPerBlock: String(s.analysisDefaults.revsPerBlock), groovedOffsetMm: String(s.groovedOffsetMm),
    backsideOffsetMm: String(s.backsideOffsetMm), pulleyUnit: s.pulleyUnit,
  };
}

const num = (v: string): number => (v.trim() === '' ? Number.NaN : Number(v.replace(',', '.')));

/** The request body from the form's text, for ShopSettingsSchema to judge. */
function toBody(v: Values) {
  return {
    name: v.name, address: v.address, phone: v.phone, defaultLeadId: v.defaultLeadId ? Number(v.defaultLeadId) : null,
    serviceAdvisorEmail: v.serviceAdvisorEmail,
    analysisDefaults: {
      envelopeBand: v.bandAuto === 'yes' ? 'auto' as const : [num(v.bandLoHz), num(v.bandHiHz)] as [number, number],
      envelopeMaxHz: num(v.envelopeMaxHz), samplesPerRev: num(v.samplesPerRev), revsPerBlock: num(v.revsPerBlock),
    },
    groovedOffsetMm: num(v.groovedOffsetMm), backsideOffsetMm: num(v.backsideOffsetMm), pulleyUnit: v.pulleyUnit as 'mm' | 'inch',
  };
}

/** Form path of a schema issue: analysisDefaults.envelopeBand.0 → bandLoHz. */
function fieldOf(path: PropertyKey[]): string {
  const [a, b, c] = path.map(String);
  if (a === 'analysisDefaults') return b === 'envelopeBand' ? (c === '1' ? 'bandHiHz' : 'bandLoHz') : b;
  return a ?? 'form';
}

/**
 * Shop setup (admin): the report header, who new cases go to, the shop's analysis defaults, the
 * measured-diameter offsets (with what their defaults rest on) and the pulley unit; the demo shop
 * switch is explained. Checked with the server's schema before sending.
 */
export function ShopSettingsForm({ settings, onSaved }: { settings: ShopSettingsDto; onSaved?: () => void }) {
  const [values, setValues] = useState<Values>(() => toValues(settings));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const save = useSaveShopSettings();
  const set = (key: string) => (e: { target: { value: string } }) => setValues((v) => ({ ...v, [key]: e.target.value }));
  const select = (key: string) => ({ name: key, value: values[key] ?? '', onChange: set(key) });
  const field = (key: string) => ({ ...select(key), error: errors[key] });

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setMessage(null);
    const parsed = ShopSettingsSchema.safeParse(toBody(values));
    if (!parsed.success) {
      const next: Record<string, string> = {};
      for (const issue of parsed.error.issues) next[fieldOf(issue.path)] ??= issue.message.replace(/^Invalid input: expected number, received NaN$/, 'Enter a number');
      setErrors(next);
      setMessage('Fix the fields outlined in red, then save again.');
      document.querySelector<HTMLElement>(`[name="${Object.keys(next)[0]}"]`)?.focus();
      return;
    }
    setErrors({});
    try {
      const saved = await save.mutateAsync(parsed.data);
      setValues(toValues(saved));
      toast({ title: 'Shop settings saved', variant: 'success' });
      onSaved?.();
    } catch (error) {
      const { fields, message: text } = formErrorsFrom(error);
      setErrors(fields);
      setMessage(text ?? 'Saving failed; try again.');
    }
  };

  return (
    <form noValidate onSubmit={(e) => void submit(e)} className="grid gap-6">
      <Card>
        <CardHeader>
          <CardTitle>Shop and report header</CardTitle>
          <CardDescription>Printed at the top of every report and e-mail to the customer.</CardDescription>
        </CardHeader>
        <CardContent className="grid gap-4 md:grid-cols-2">
          <Field label="Shop name" {...field('name')} />
          <Field label="Phone" autoComplete="tel" {...field('phone')} />
          <div className="md:col-span-2"><Field label="Address" hint="One line, as it should appear on the report" autoComplete="street-address" {...field('address')} /></div>
        </CardContent>
      </Card>
      <Card>
        <CardHeader>
          <CardTitle>New cases</CardTitle>
          <CardDescription>Who a new case goes to for sign-off, and where the finished report is sent.</CardDescription>
        </CardHeader>
        <CardContent className="grid gap-4 md:grid-cols-2">
          <div className="grid gap-1.5">
            <Label htmlFor="defaultLeadId">Default lead technician</Label>
            <Select id="defaultLeadId" {...select('defaultLeadId')} aria-invalid={errors.defaultLeadId ? true : undefined}>
              <option value="">— none —</option>
              {settings.leads.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
            </Select>
            {errors.defaultLeadId ? <p className="text-xs font-medium text-destructive">{errors.defaultLeadId}</p> : null}
          </div>
          <Field label="Service advisor's e-mail" type="email" hint="Reports are offered to this address" {...field('serviceAdvisorEmail')} />
        </CardContent>
      </Card>
      <Card>
        <CardHeader>
          <CardTitle>Analysis defaults</CardTitle>
          <CardDescription>
            Set once for your pickup and recorder; every new analysis starts from these. Defaults: band chosen automatically up to
            {' '}{DEFAULTS.envelopeMaxHz} Hz, {DEFAULTS.samplesPerRev} samples per revolution, {DEFAULTS.revsPerBlock} revolutions per block.
          </CardDescription>
        </CardHeader>
        <CardContent className="grid gap-4 md:grid-cols-3">
          <div className="grid gap-1.5">
            <Label htmlFor="bandAuto">Bearing-noise band</Label>
            <Select id="bandAuto" {...select('bandAuto')}>
              <option value="yes">chosen automatically</option>
              <option value="no">fixed band (Hz)</option>
            </Select>
          </div>
          {values.bandAuto === 'no' ? (
            <>
              <Field label="Band from (Hz)" inputMode="decimal" className="font-mono" {...field('bandLoHz')} />
              <Field label="Band to (Hz)" inputMode="decimal" className="font-mono" {...field('bandHiHz')} />
            </>
          ) : <div className="md:col-span-2" />}
          <Field label="Highest band frequency (Hz)" inputMode="decimal" className="font-mono" hint="Your pickup's useful upper limit" {...field('envelopeMaxHz')} />
          <Field label="Samples per revolution" inputMode="numeric" className="font-mono" hint="A power of two, e.g. 256" {...field('samplesPerRev')} />
          <Field label="Revolutions per block" inputMode="numeric" className="font-mono" hint="Order resolution = 1 / this; a power of two" {...field('revsPerBlock')} />
        </CardContent>
      </Card>
      <Card>
        <CardHeader>
          <CardTitle>Pulley diameters as measured</CardTitle>
          <CardDescription>
            Calipers across a ribbed pulley read the rib tips, not the effective diameter the speed ratio needs. When a part's
            pulley is entered as measured, Crankwise adds these offsets (on the diameter).
          </CardDescription>
        </CardHeader>
        <CardContent className="grid gap-4 md:grid-cols-3">
          <div className="grid gap-1">
            <Field label="Grooved pulley offset (mm)" inputMode="decimal" className="font-mono" {...field('groovedOffsetMm')} />
            <p className="text-xs text-muted-foreground">{OFFSET_BASIS.grooved}</p>
          </div>
          <div className="grid gap-1">
            <Field label="Backside pulley offset (mm)" inputMode="decimal" className="font-mono" {...field('backsideOffsetMm')} />
            <p className="text-xs text-muted-foreground">{OFFSET_BASIS.backside}</p>
          </div>
          <div className="grid gap-1.5 self-start">
            <Label htmlFor="pulleyUnit">Pulley diameters in</Label>
            <Select id="pulleyUnit" {...select('pulleyUnit')}>
              <option value="mm">millimetres</option>
              <option value="inch">inches</option>
            </Select>
          </div>
        </CardContent>
      </Card>
      <Card>
        <CardHeader>
          <CardTitle>Demo shop</CardTitle>
        </CardHeader>
        <CardContent className="text-sm leading-relaxed">
          {settings.isDemo
            ? <p>This is the invented demo shop. Its people, engines and vehicles are made up, and its passwords are printed in the README: never keep real work here.</p>
            : <p>This is a real shop. The invented demo shop is a separate shop that lives beside it.</p>}
          <p className="mt-2 text-muted-foreground">
            The demo shop is switched by whoever runs the server, not from this page: starting it with <code className="font-mono">DEMO=off</code> removes
            the demo shop and everything marked as demo data, and nothing else. Do that on any machine other people can reach.
          </p>
        </CardContent>
      </Card>
      <div className="flex flex-wrap items-center justify-end gap-3">
        {message ? <p role="alert" className="mr-auto text-sm text-destructive">{message}</p> : null}
        <Button type="submit" pending={save.isPending}>Save shop settings</Button>
      </div>
    </form>
  );
}
