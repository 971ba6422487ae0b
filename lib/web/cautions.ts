/**
 * The cautions, in one place: the layout's footer, the campaign report and
 * its PDF all print these words, so they cannot drift apart.
 */
export const CAUTION_SHORT =
  "Holdfast is advisory and after the fact. It is not part of any DP control system and not a class or compliance tool; follow your vessel's DP documentation, class rules, industry guidance and licensed practice.";

export const CAUTION_REPORT = [
  'Advisory, after the fact. These figures summarise telemetry the vessels sent; they are computed after the event and are not a live view of any vessel.',
  'Not part of any DP control system. Nothing here commands, tunes or checks a DP system.',
  'Not a class or compliance record. Station-keeping capability, limits and incidents are governed by the vessel’s DP documentation, class rules, industry guidance and licensed practice, which this report does not replace.',
];
