import { PlaceholderPage } from './placeholder';

/** Bearings: the shop-editable table of bearings by designation. */
export function BearingsRoute() {
  return (
    <PlaceholderPage
      title="Bearings"
      description="Bearings by designation: ball count, ball and pitch diameters, contact angle, and where the numbers came from."
      emptyTitle="The bearing table is not here yet"
    >
      This table will start with published rows and take your shop's own measured or estimated bearings, so a drive component
      can name a designation such as 6203 instead of its geometry.
    </PlaceholderPage>
  );
}
