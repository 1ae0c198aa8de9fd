/** The placeholder a carrier's tracking link template must contain, replaced by the parcel's tracking number. */
export const trackingPlaceholder = '{tracking}';

/** A parcel's tracking link: the carrier's template with the tracking number, percent-encoded, in place. */
export function trackingUrl(template: string, trackingNumber: string): string {
  return template.split(trackingPlaceholder).join(encodeURIComponent(trackingNumber));
}

/** Whether a parcel to `country` leaves the studio's customs area and so travels with a customs declaration. */
export function needsCustomsDeclaration(customsArea: readonly string[], originCountry: string, country: string): boolean {
  if (country === originCountry) return false;
  return !customsArea.includes(country);
}
