import { PlaceholderPage } from './placeholder';

/** Drive library: the shop's engines and their accessory drives. */
export function DriveLibraryRoute() {
  return (
    <PlaceholderPage
      title="Drive library"
      description="Your shop's engines and their accessory drives: belts, effective pulley diameters and bearings."
      emptyTitle="No engines entered yet"
    >
      Each engine's drive is entered once: its belts, every pulley's effective diameter and each part's bearing. Crankwise turns
      it into the crank orders at which every part can sing, shows the computed ratios and defect orders beside each row, and
      sketches the belt layout. Import and export as JSON or CSV will be here too.
    </PlaceholderPage>
  );
}
