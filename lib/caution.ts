/**
 * The caution from PRODUCT.md, shown in the app (every page), the README and every export.
 * Keep the wording in sync with README.md.
 */
export const CAUTION_TITLE = "Engineering aid — not a medical device";

export const CAUTION_TEXT =
  "Tidewright is an engineering design and simulation aid. It is not a medical device and does not give clinical " +
  "advice. Simulated results do not replace bench testing with a calibrated test lung, clinical evaluation, or " +
  "the approval a ventilator needs under the medical device rules where it will be used. Follow local regulations " +
  "and licensed clinical practice.";
