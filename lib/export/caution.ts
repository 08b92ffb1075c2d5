// DESIGN §9: every export says what a flag is and is not.
export const EXPORT_CAUTION =
  "A flag is a possible inconsistency computed from the numbers as printed (and as coded). It can come from a typo, a coding mistake, rounding or an engine limitation; it is not evidence of misconduct. Only verified entries are public; each entry names who coded and who verified it.";
