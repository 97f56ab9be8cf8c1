import { Caution } from '../../components/ui/states';

/**
 * The workshop cautions (docs/references.md §6, trade practice): shown compact under every page and
 * in full where captures are planned.
 */
export function SafetyNote({ compact = false }: { compact?: boolean }) {
  if (compact) {
    return (
      <p role="note" className="border-l-2 border-warning pl-3 text-xs leading-relaxed text-muted-foreground">
        <span className="font-semibold text-warning-foreground">Safety:</span> keep hands, tools, leads, clothing and hair away from
        belts, pulleys and fans. Electric cooling fans can start with the engine off. Exhaust and cooling system get hot;
        ignition voltage is tens of kilovolts. Follow your shop’s rules.
      </p>
    );
  }
  return (
    <Caution title="Before you record at a running engine">
      <ul className="mt-1 list-disc space-y-1 pl-5">
        <li>Keep hands, tools, pickup leads, clothing and hair away from belts, pulleys and fans.</li>
        <li>Electric cooling fans can start on their own, even with the engine off.</li>
        <li>Exhaust parts and the cooling system get hot; the cooling system is under pressure.</li>
        <li>
          Ignition secondary voltage is tens of kilovolts (a particular risk for people with pacemakers): attach pickups with the
          engine off.
        </li>
        <li>Run the engine only with exhaust extraction; secure the vehicle (park or neutral, brake, chocks).</li>
        <li>Probe stationary housings and bolts, never a turning pulley face, shaft end, belt or fan.</li>
        <li>Your shop’s rules and local regulations come first.</li>
      </ul>
    </Caution>
  );
}
