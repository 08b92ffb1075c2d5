// Reporting slips planted in the demo corpus, one kind per paper, so every finding code of DESIGN §4.3
// appears in the demo. Each slip changes the printed text the way a typo or a wrong procedure would.
import { chisqUpperTail } from "@/lib/recheck/distributions/chisq";
import { fixed, printFit, printP, scaledDifference } from "./figures";
import type { Built } from "./designs";
import type { Random } from "./random";
import type { DemoComparison, DemoModel } from "./types";

export type Slip = (built: Built, random: Random) => boolean;

const model = (built: Built, label: string): DemoModel => built.sample.models.find((item) => item.label === label)!;
const first = (built: Built, method?: DemoComparison["method"]) =>
  built.sample.comparisons.find((item) => !method || item.method === method);
const withTest = (built: Built) => built.sample.comparisons.find((item) => item.figures.dChisq && item.figures.dDf && item.method !== "ic");

/** Bumps the last printed digit(s): ".058" → ".085"-like typos that stay well outside rounding. */
function typo(text: string, factor: number): string {
  const decimals = (text.split(".")[1] ?? "").length;
  const value = Number(text) * factor;
  return text.startsWith(".") || text.startsWith("-.") ? printFit(value, decimals) : fixed(value, decimals);
}

/** Figures a slip leaves unprinted, because the paper would not have printed them consistently either. */
function unprint(model: DemoModel, keys: readonly (keyof DemoModel["figures"])[]): void {
  for (const key of keys) delete model.figures[key];
}

/** The figures that follow from a model's χ²: dropped when a slip changes that χ². */
const FIT_FROM_CHISQ = ["p", "rmsea", "rmseaLo", "rmseaHi", "cfi", "tli"] as const;

export const SLIPS: Record<string, Slip> = {
  "df-difference-mismatch": (built) => {
    const item = withTest(built);
    if (!item) return false;
    item.figures.dDf = String(Number(item.figures.dDf) + 1);
    return true;
  },
  "chisq-difference-mismatch": (built) => {
    const item = withTest(built);
    if (!item || item.method !== "lrt") return false;
    const wrong = Number(item.figures.dChisq) + 6.4;
    item.figures.dChisq = fixed(wrong, 2);
    item.figures.dP = printP(chisqUpperTail(wrong, Number(item.figures.dDf)));
    return true;
  },
  "difference-p-mismatch": (built) => {
    const item = built.sample.comparisons.find((entry) => entry.figures.dP && entry.figures.dP !== "< .001" && Number(entry.figures.dP) > 0.08);
    if (!item) return false;
    item.figures.dP = printP(Math.min(0.99, Number(item.figures.dP) * 1.6 + 0.05));
    return true;
  },
  "difference-conclusion-changed": (built) => {
    const item = withTest(built);
    if (!item) return false;
    const ddf = Number(item.figures.dDf);
    // a statistic whose true p is about .20, printed as significant
    const statistic = ddf + 1.3 * Math.sqrt(2 * ddf);
    item.figures.dChisq = fixed(statistic, 2);
    const p = chisqUpperTail(statistic, ddf);
    if (p < 0.07) return false;
    item.figures.dP = "< .05";
    return true;
  },
  "halved-p": (built) => {
    const item = withTest(built);
    if (!item) return false;
    const ddf = Number(item.figures.dDf);
    const statistic = ddf + 1.0 * Math.sqrt(2 * ddf);
    item.figures.dChisq = fixed(statistic, 2);
    const p = chisqUpperTail(Number(item.figures.dChisq), ddf);
    item.figures.dP = printP(p / 2);
    return p > 0.1;
  },
  "unscaled-robust-difference": (built) => {
    const item = first(built, "scaled_lrt") ?? built.sample.comparisons.find((entry) => entry.method === "invariance" && model(built, entry.restricted).figures.scaling);
    if (!item) return false;
    const a = model(built, item.restricted).figures.chisqScaled;
    const b = model(built, item.free).figures.chisqScaled;
    if (!a || !b) return false;
    const plain = Number(a) - Number(b);
    item.figures.dChisq = fixed(plain, 2);
    item.figures.dP = printP(chisqUpperTail(plain, Number(item.figures.dDf)));
    return true;
  },
  "scaled-difference-mismatch": (built) => {
    const item = first(built, "scaled_lrt");
    if (!item || !model(built, item.restricted).figures.scaling) return false;
    const wrong = Number(item.figures.dChisq) * 1.45 + 3;
    item.figures.dChisq = fixed(wrong, 2);
    item.figures.dP = printP(chisqUpperTail(wrong, Number(item.figures.dDf)));
    return true;
  },
  "negative-scaling-correction": (built) => {
    const item = first(built, "scaled_lrt");
    if (!item) return false;
    const a = built.truth.get(item.restricted)!;
    const b = built.truth.get(item.free)!;
    if (!model(built, item.restricted).figures.scaling) return false;
    // the free model's correction is much larger: df_A·c_A − df_B·c_B ≤ 0
    b.scaling = (a.df * a.scaling) / b.df + 0.08;
    const shown = model(built, item.free);
    shown.figures.scaling = fixed(b.scaling, 3);
    shown.figures.chisqScaled = fixed(b.chisq / b.scaling, 2);
    unprint(shown, FIT_FROM_CHISQ);
    item.figures.dChisq = fixed(Math.abs(scaledDifference(a, b, false).statistic), 2);
    delete item.figures.dP;
    return true;
  },
  "lrt-on-non-nested": (built) => {
    const item = first(built, "ic");
    if (!item) return false;
    const a = model(built, item.restricted);
    const b = model(built, item.free);
    if (a.figures.df === b.figures.df || !a.figures.chisq || !b.figures.chisq) return false;
    item.method = "lrt";
    const statistic = Number(a.figures.chisq) - Number(b.figures.chisq);
    const ddf = Number(a.figures.df) - Number(b.figures.df);
    if (statistic <= 0) return false;
    item.figures = { dChisq: fixed(statistic, 2), dDf: String(ddf), dP: printP(chisqUpperTail(statistic, ddf)) };
    return true;
  },
  "zero-df-difference": (built) => {
    const item = built.sample.comparisons.find((entry) => entry.method === "ic" && model(built, entry.restricted).figures.df === model(built, entry.free).figures.df);
    if (!item) return false;
    item.method = "lrt";
    item.figures = { dChisq: fixed(Math.abs(Number(model(built, item.restricted).figures.chisq) - Number(model(built, item.free).figures.chisq)), 2), dDf: "0" };
    return true;
  },
  "negative-chisq-difference": (built) => {
    const item = first(built, "lrt");
    if (!item) return false;
    const a = model(built, item.restricted);
    const b = model(built, item.free);
    // the restricted model printed with the smaller chi-square: the two values were swapped in the table
    [a.figures.chisq, b.figures.chisq] = [b.figures.chisq, a.figures.chisq];
    for (const shown of [a, b]) {
      unprint(shown, [...FIT_FROM_CHISQ, "aic", "bic", "loglik"]);
    }
    const statistic = Number(a.figures.chisq) - Number(b.figures.chisq);
    item.figures = { dChisq: fixed(statistic, 2), dDf: item.figures.dDf };
    return true;
  },
  "restricted-model-order": (built) => {
    const item = first(built, "lrt") ?? first(built, "scaled_lrt");
    if (!item) return false;
    [item.restricted, item.free] = [item.free, item.restricted];
    item.preferred = item.preferred === "a" ? "b" : item.preferred === "b" ? "a" : item.preferred;
    return true;
  },
  "negative-df": (built) => {
    const item = withTest(built);
    if (!item) return false;
    const free = model(built, item.free);
    free.figures.df = "-1";
    unprint(free, [...FIT_FROM_CHISQ, "npar", "nObserved"]);
    delete item.figures.dDf;
    return true;
  },
  "model-p-mismatch": (built) => {
    const shown = built.sample.models.find((item) => item.figures.p && item.figures.p !== "< .001" && Number(item.figures.p) > 0.08);
    if (shown) {
      shown.figures.p = printP(Math.min(0.99, Number(shown.figures.p) * 1.7));
      return true;
    }
    const small = built.sample.models.find((item) => item.figures.p === "< .001");
    if (!small) return false;
    small.figures.p = ".004";
    return true;
  },
  "model-conclusion-changed": (built) => {
    const shown = built.sample.models.find((item) => item.figures.p === "< .001");
    if (!shown) return false;
    shown.figures.p = ".210";
    return true;
  },
  "p-printed-as-zero": (built) => {
    const shown = built.sample.models.find((item) => item.figures.p === "< .001");
    if (!shown) return false;
    shown.figures.p = ".000";
    return true;
  },
  "rmsea-mismatch": (built) => {
    const shown = built.sample.models.find((item) => item.figures.rmsea && Number(item.figures.rmsea) > 0.02);
    if (!shown) return false;
    shown.figures.rmsea = typo(shown.figures.rmsea!, 1.5);
    unprint(shown, ["rmseaLo", "rmseaHi"]);
    return true;
  },
  "rmsea-interval-mismatch": (built) => {
    const shown = built.sample.models.find((item) => item.figures.rmseaHi && Number(item.figures.rmseaHi) > 0.03);
    if (!shown) return false;
    shown.figures.rmseaHi = typo(shown.figures.rmseaHi!, 1.35);
    return true;
  },
  "cfi-mismatch": (built) => {
    const shown = built.sample.models.find((item) => item.figures.baselineChisq && item.figures.cfi && Number(item.figures.cfi) < 0.97);
    if (!shown) return false;
    shown.figures.cfi = printFit(Math.min(0.999, Number(shown.figures.cfi) + 0.03), 3);
    return true;
  },
  "tli-mismatch": (built) => {
    const shown = built.sample.models.find((item) => item.figures.baselineChisq && item.figures.tli && Number(item.figures.tli) < 0.96);
    if (!shown) return false;
    shown.figures.tli = printFit(Math.min(0.999, Number(shown.figures.tli) + 0.04), 3);
    return true;
  },
  "df-recount-mismatch": (built) => {
    const shown = built.sample.models.find((item) => item.figures.nObserved && item.figures.npar && !item.figures.aic);
    if (!shown) return false;
    shown.figures.npar = String(Number(shown.figures.npar) - 2);
    return true;
  },
  "information-criteria-inconsistent": (built) => {
    const shown = built.sample.models.find((item) => item.figures.aic && item.estimator === "ML");
    if (!shown) return false;
    shown.figures.aic = fixed(Number(shown.figures.aic) - 25.4, 2);
    return true;
  },
  "preferred-model-contradicts-criteria": (built) => {
    const item = built.sample.comparisons.find((entry) => entry.method === "ic" && entry.preferred !== "none");
    if (!item) return false;
    const a = model(built, item.restricted).figures;
    const b = model(built, item.free).figures;
    const aicWorse = Number(a.aic) > Number(b.aic) ? "a" : "b";
    const bicWorse = Number(a.bic) > Number(b.bic) ? "a" : "b";
    if (aicWorse !== bicWorse) return false;
    item.preferred = aicWorse;
    return true;
  },
  "poor-fit-both": (built) => {
    const item = withTest(built);
    if (!item || item.method !== "lrt") return false;
    // the paper compares two models that both misfit badly
    for (const label of [item.restricted, item.free]) {
      const truth = built.truth.get(label)!;
      const shown = model(built, label);
      shown.figures.rmsea = printFit(0.112 + (truth.df % 7) / 1000, 3);
      shown.figures.cfi = printFit(0.81 + (truth.df % 5) / 100, 3);
      unprint(shown, ["rmseaLo", "rmseaHi", "tli", "baselineChisq", "baselineDf", "p", "chisq", "aic", "bic", "loglik"]);
    }
    delete item.figures.dP;
    return true;
  },
  "invariance-cutoff-exceeded": (built) => {
    const item = first(built, "invariance");
    if (!item) return false;
    const restricted = model(built, item.restricted);
    const free = model(built, item.free);
    restricted.figures.cfi = printFit(Number(free.figures.cfi) - 0.024, 3);
    delete restricted.figures.tli;
    item.figures.dCfi = printFit(Number(restricted.figures.cfi) - Number(free.figures.cfi), 3);
    item.invarianceClaimed = "yes";
    return true;
  },
  "delta-fit-mismatch": (built) => {
    const item = built.sample.comparisons.find((entry) => entry.figures.dCfi);
    if (!item) return false;
    item.figures.dCfi = printFit(Number(item.figures.dCfi) + 0.006, 3);
    return true;
  },
  "just-identified-model": () => false,
  "criteria-near-tie": () => false,
};
