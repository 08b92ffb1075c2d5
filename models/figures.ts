// Printed figures are stored twice: the text exactly as printed (its decimals set the rounding
// tolerance, DESIGN §4.1) and the parsed number for sorting and statistics.

/** Figures reported for one fitted model (DESIGN §3 Model; the a_ and b_ sheet columns of §5). */
export const MODEL_FIGURES = [
  "chisq",
  "df",
  "p",
  "chisqScaled",
  "scaling",
  "cfi",
  "tli",
  "rmsea",
  "rmseaLo",
  "rmseaHi",
  "srmr",
  "aic",
  "bic",
  "loglik",
  "loglikScaling",
  "npar",
  "nObserved",
  "nFixedX",
  "baselineChisq",
  "baselineDf",
] as const;
export type ModelFigure = (typeof MODEL_FIGURES)[number];

/** Difference figures reported for a comparison, read as restricted minus free. */
export const COMPARISON_FIGURES = ["dChisq", "dDf", "dP", "dCfi", "dRmsea", "dAic", "dBic"] as const;
export type ComparisonFigure = (typeof COMPARISON_FIGURES)[number];

export const textAttribute = (figure: string) => `${figure}Text`;
