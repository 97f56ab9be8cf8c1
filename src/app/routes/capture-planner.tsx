import { NavIcon } from '../nav-icons';
import { PlaceholderPage } from './placeholder';
import { SafetyNote } from './safety-note';

/** Capture planner: where probe points and engine conditions are planned; the cautions belong here. */
export function CapturePlannerRoute() {
  return (
    <PlaceholderPage
      icon={<NavIcon section="capture-planner" className="size-10" />}
      title="Capture planner"
      description="Plan the recordings for a case: probe points near each suspect, engine conditions, and the reference channel."
      emptyTitle="No capture plans yet"
      after={<SafetyNote />}
    >
      The planner will suggest probe points on stationary housings near each part of the drive, the engine conditions worth
      recording (idle, held rpm, A/C clutch on and off, a short belt-off run), and how to wire the reference and the pickup.
    </PlaceholderPage>
  );
}
