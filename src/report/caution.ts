// The caution every output carries.
export const CAUTION =
  "Preliminary design aid only: check every result against the local stormwater and dam-safety codes; " +
  "a licensed professional engineer must review, complete and seal any design.";
