import { NavIcon } from '../nav-icons';
import { PlaceholderPage } from './placeholder';

/** Cases: one per repair order (docs/design.md "Domain model"); the list arrives with the Cases work. */
export function CasesRoute() {
  return (
    <PlaceholderPage
      icon={<NavIcon section="cases" className="size-10" />}
      title="Cases"
      description="One case per repair order: the vehicle, the complaint, its captures, the ranked suspects and the timeline."
      emptyTitle="No cases yet"
    >
      Open a case for a repair order, record captures at several probe points, and Crankwise ranks the accessory-drive parts
      whose lines show up. Cases of your shop will be listed here with their status, from open to verified.
    </PlaceholderPage>
  );
}
