// The catalogue of finding codes (DESIGN §4.3). The UI, the facets and the documentation read codes,
// titles and explanations from here; the engine reads default severities from here.
import type { Severity } from "./types";

export interface CatalogueEntry {
  /** the usual severity; scaled-difference-mismatch is raised to error when the conclusion changes */
  severity: Severity;
  title: string;
  /** plain language for readers who are not statisticians, shown beside the finding */
  explanation: string;
  /** the published source of the rule, or "common practice" */
  source: string;
}

export const FINDING_CODES = [
  "restricted-model-order",
  "just-identified-model",
  "negative-df",
  "df-difference-mismatch",
  "zero-df-difference",
  "chisq-difference-mismatch",
  "negative-chisq-difference",
  "difference-p-mismatch",
  "difference-conclusion-changed",
  "halved-p",
  "unscaled-robust-difference",
  "scaled-difference-mismatch",
  "negative-scaling-correction",
  "model-p-mismatch",
  "model-conclusion-changed",
  "rmsea-mismatch",
  "rmsea-interval-mismatch",
  "cfi-mismatch",
  "tli-mismatch",
  "df-recount-mismatch",
  "information-criteria-inconsistent",
  "preferred-model-contradicts-criteria",
  "criteria-disagree",
  "criteria-near-tie",
  "lrt-on-non-nested",
  "poor-fit-both",
  "invariance-cutoff-exceeded",
  "delta-fit-mismatch",
  "p-printed-as-zero",
] as const;

export type FindingCode = (typeof FINDING_CODES)[number];

export const FINDING_CATALOGUE: Readonly<Record<FindingCode, CatalogueEntry>> = {
  "restricted-model-order": {
    severity: "warning",
    title: "Models entered in the wrong order",
    explanation:
      "The model with more degrees of freedom (the more constrained one) belongs in the first column. The two were swapped before checking; please check the coding.",
    source: "common practice (Fitledger coding rule: model A is the restricted model)",
  },
  "just-identified-model": {
    severity: "error",
    title: "A just-identified model was compared",
    explanation:
      "A model with zero degrees of freedom reproduces the data exactly, so its fit cannot be tested and comparing against it is only the other model's own fit test (or nothing at all).",
    source: "common practice (any SEM text, e.g. Kline 2016, ch. 6)",
  },
  "negative-df": {
    severity: "error",
    title: "Negative degrees of freedom",
    explanation: "A model with fewer data moments than free parameters is not identified: its estimates and fit statistics are not meaningful.",
    source: "common practice (identification: df = moments − parameters ≥ 0)",
  },
  "df-difference-mismatch": {
    severity: "error",
    title: "Δdf does not add up",
    explanation: "The reported difference in degrees of freedom is not the difference of the two models' reported degrees of freedom.",
    source: "arithmetic of the chi-square difference test (Steiger, Shapiro & Browne 1985)",
  },
  "zero-df-difference": {
    severity: "error",
    title: "No degrees of freedom to test",
    explanation: "Both models have the same degrees of freedom, so a chi-square difference test between them does not exist.",
    source: "Steiger, Shapiro & Browne (1985)",
  },
  "chisq-difference-mismatch": {
    severity: "warning",
    title: "Δχ² does not add up",
    explanation: "The reported chi-square difference is not the difference of the two models' reported chi-squares, even allowing for rounding.",
    source: "arithmetic of the chi-square difference test (Steiger, Shapiro & Browne 1985)",
  },
  "negative-chisq-difference": {
    severity: "error",
    title: "The restricted model fits better",
    explanation:
      "Under maximum likelihood a model with added constraints can never fit better than the model it is nested in, so its chi-square cannot be smaller. Models may be swapped, not nested, or mistyped.",
    source: "properties of the likelihood-ratio test for nested models (Steiger, Shapiro & Browne 1985)",
  },
  "difference-p-mismatch": {
    severity: "warning",
    title: "Difference-test p does not follow",
    explanation: "The reported p of the difference test is not the p-value of the reported Δχ² at the reported Δdf, allowing for rounding.",
    source: "chi-square distribution; reporting-error checks as in Nuijten et al. (2016)",
  },
  "difference-conclusion-changed": {
    severity: "error",
    title: "Difference-test conclusion changes",
    explanation:
      "The recomputed p of the difference test lies on the other side of the significance level from the reported one: the reported conclusion does not follow from the reported numbers.",
    source: "chi-square distribution; gross inconsistency as in Nuijten et al. (2016)",
  },
  "halved-p": {
    severity: "warning",
    title: "p-value looks halved",
    explanation: "The reported p is half the recomputed one. Chi-square tests are already one-sided, so halving the p-value is not justified.",
    source: "Bakker & Wicherts (2011)",
  },
  "unscaled-robust-difference": {
    severity: "error",
    title: "Robust chi-squares subtracted directly",
    explanation:
      "With a robust estimator the reported difference equals the plain difference of the two scaled chi-squares. That difference does not follow a chi-square distribution; the scaled difference test is needed.",
    source: "Satorra & Bentler (2001)",
  },
  "scaled-difference-mismatch": {
    severity: "warning",
    title: "Scaled difference does not follow",
    explanation:
      "The reported scaled chi-square difference (or its p) is not reproduced from the models' chi-squares and scaling factors. It is an error when the conclusion at the significance level changes.",
    source: "Satorra & Bentler (2001)",
  },
  "negative-scaling-correction": {
    severity: "warning",
    title: "Scaled difference undefined",
    explanation:
      "The scaling correction of the difference test comes out zero or negative, so the 2001 scaled difference cannot be computed. The strictly positive version needs output that papers rarely report.",
    source: "Satorra & Bentler (2001, 2010)",
  },
  "model-p-mismatch": {
    severity: "warning",
    title: "Model p does not follow",
    explanation: "The model's reported p is not the p-value of its reported chi-square at its degrees of freedom, allowing for rounding.",
    source: "chi-square distribution",
  },
  "model-conclusion-changed": {
    severity: "error",
    title: "Model-test conclusion changes",
    explanation: "The recomputed p of the model's own chi-square test lies on the other side of the significance level from the reported p.",
    source: "chi-square distribution",
  },
  "rmsea-mismatch": {
    severity: "warning",
    title: "RMSEA does not follow",
    explanation: "The reported RMSEA is not reproduced from the model's chi-square, degrees of freedom and sample size under any common convention.",
    source: "Steiger & Lind (1980); Steiger (1998) for several groups",
  },
  "rmsea-interval-mismatch": {
    severity: "warning",
    title: "RMSEA interval does not follow",
    explanation: "The reported 90 % confidence interval of the RMSEA is not reproduced from the model's chi-square, degrees of freedom and sample size.",
    source: "Browne & Cudeck (1993)",
  },
  "cfi-mismatch": {
    severity: "warning",
    title: "CFI does not follow",
    explanation: "The reported CFI is not reproduced from the model's and the baseline model's chi-squares and degrees of freedom.",
    source: "Bentler (1990)",
  },
  "tli-mismatch": {
    severity: "warning",
    title: "TLI does not follow",
    explanation: "The reported TLI is not reproduced from the model's and the baseline model's chi-squares and degrees of freedom.",
    source: "Tucker & Lewis (1973)",
  },
  "df-recount-mismatch": {
    severity: "warning",
    title: "Degrees of freedom do not recount",
    explanation:
      "The model's degrees of freedom are not the number of data moments (variances, covariances and, with a mean structure, means) minus the number of free parameters.",
    source: "moments minus free parameters (e.g. SAS/STAT PROC CALIS documentation; Bollen 1989)",
  },
  "information-criteria-inconsistent": {
    severity: "warning",
    title: "AIC/BIC do not add up",
    explanation:
      "For two models fitted by maximum likelihood to the same data, AIC and BIC differences are fixed by the chi-square difference and the df difference (and each AIC/BIC by the log-likelihood and number of parameters). The reported values break that arithmetic.",
    source: "Akaike (1974); Schwarz (1978)",
  },
  "preferred-model-contradicts-criteria": {
    severity: "warning",
    title: "Preferred model has the worse criterion",
    explanation: "The paper prefers the model with the larger AIC (or BIC), although smaller values indicate the better model.",
    source: "Akaike (1974); Schwarz (1978); Burnham & Anderson (2002)",
  },
  "criteria-disagree": {
    severity: "note",
    title: "AIC and BIC point different ways",
    explanation: "AIC favours one model and BIC the other. A preference should say which criterion it rests on and why.",
    source: "Burnham & Anderson (2002); common practice",
  },
  "criteria-near-tie": {
    severity: "note",
    title: "Models nearly tied on AIC",
    explanation:
      "The AIC difference is below 2: the data barely distinguish the models. AIC always picks one, but here it cannot say that one is clearly better.",
    source: "Burnham & Anderson (2002)",
  },
  "lrt-on-non-nested": {
    severity: "error",
    title: "Difference test on non-nested models",
    explanation: "The chi-square difference test is only valid for nested models; for models that are not nested, information criteria or other tests are needed.",
    source: "Steiger, Shapiro & Browne (1985); Vuong (1989)",
  },
  "poor-fit-both": {
    severity: "note",
    title: "Neither model fits well",
    explanation:
      "Both compared models miss the usual fit cutoffs. Comparing two misfitting models says little about either; the reasons for the misfit come first.",
    source: "common practice (cutoffs RMSEA ≤ .08, CFI ≥ .90)",
  },
  "invariance-cutoff-exceeded": {
    severity: "warning",
    title: "Invariance claimed despite change in fit",
    explanation:
      "Measurement invariance is claimed although the change in fit exceeds the usual cutoffs (CFI drops by .01 or more, or RMSEA rises by .015 or more).",
    source: "Cheung & Rensvold (2002) for ΔCFI; Chen (2007) for ΔRMSEA",
  },
  "delta-fit-mismatch": {
    severity: "warning",
    title: "ΔCFI / ΔRMSEA do not add up",
    explanation: "The reported change in CFI or RMSEA is not the difference of the two models' reported values (read as restricted minus free).",
    source: "arithmetic of the reported figures",
  },
  "p-printed-as-zero": {
    severity: "note",
    title: "p printed as zero",
    explanation: "A p-value is never exactly zero; a very small p should be reported as p < .001.",
    source: "APA Publication Manual (7th ed.), §6.36",
  },
};
