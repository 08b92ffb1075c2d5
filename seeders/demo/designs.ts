// Study designs that SEM papers report, each producing models and comparisons printed the way a clean
// paper would print them.
import { chisqUpperTail } from "@/lib/recheck/distributions/chisq";
import type { Estimator, Method } from "@/lib/recheck/types";
import { fixed, printFit, printModel, printP, ROBUST, scaledDifference, type PrintStyle, type TrueModel } from "./figures";
import type { Random } from "./random";
import type { DemoComparison, DemoModel, DemoSample } from "./types";

export interface Built {
  truth: Map<string, TrueModel>;
  style: PrintStyle;
  sample: DemoSample;
}

interface SampleSpec {
  label: string;
  n: number;
  groups: number;
  items: number;
  factors: number;
  estimator: Estimator;
}

function baseStyle(random: Random, estimator: Estimator): PrintStyle {
  const robust = ROBUST.includes(estimator);
  return {
    chisqDecimals: 2,
    fitDecimals: 3,
    rmseaSqrtG: random.chance(0.6),
    baseline: !robust && random.chance(0.45),
    informationCriteria: estimator !== "WLSMV" && random.chance(0.5),
    loglikForm: estimator === "MLR" && random.chance(0.2),
    parameterCounts: random.chance(0.35),
  };
}

function trueModel(spec: SampleSpec, random: Random, label: string, df: number, ratio: number, meanStructure: boolean, loglikSaturated: number, baseline: { chisq: number; df: number }): TrueModel {
  const moments = spec.groups * ((spec.items * (spec.items + 1)) / 2 + (meanStructure ? spec.items : 0));
  return {
    label,
    estimator: spec.estimator,
    chisq: df * ratio,
    df,
    npar: moments - df,
    nObserved: spec.items,
    meanStructure,
    n: spec.n,
    groups: spec.groups,
    baselineChisq: baseline.chisq,
    baselineDf: baseline.df,
    loglikSaturated,
    scaling: random.between(1.08, 1.32),
    loglikScaling: random.between(1.1, 1.4),
  };
}

function baselineFor(spec: SampleSpec, random: Random) {
  const df = spec.groups * ((spec.items * (spec.items - 1)) / 2);
  return { df, chisq: df * random.between(9, 22) * (spec.n / 400 + 0.6) };
}

function printed(model: TrueModel, style: PrintStyle): DemoModel {
  return { label: model.label, estimator: model.estimator, meanStructure: model.meanStructure, figures: printModel(model, style) };
}

/** Difference test figures as a careful paper prints them (scaled for robust estimators). */
export function differenceFigures(a: TrueModel, b: TrueModel, style: PrintStyle, random: Random): { method: Method; figures: DemoComparison["figures"] } {
  const ddf = a.df - b.df;
  const robust = ROBUST.includes(a.estimator);
  let statistic = a.chisq - b.chisq;
  if (robust && a.estimator === "WLSMV") statistic = (a.chisq / a.scaling - b.chisq / b.scaling) * random.between(0.7, 0.9);
  else if (robust) statistic = scaledDifference(a, b, style.loglikForm).statistic;
  const figures: DemoComparison["figures"] = {
    dChisq: fixed(statistic, 2),
    dDf: String(ddf),
    dP: printP(chisqUpperTail(statistic, ddf)),
  };
  return { method: robust ? "scaled_lrt" : "lrt", figures };
}

function comparison(label: string, a: DemoModel, b: DemoModel, method: Method, figures: DemoComparison["figures"], location: string, extra: Partial<DemoComparison> = {}): DemoComparison {
  return {
    label,
    method,
    nested: "yes",
    restricted: a.label,
    free: b.label,
    location,
    figures,
    preferred: null,
    invarianceClaimed: "n/a",
    notes: null,
    ...extra,
  };
}

/** Competing factor structures on one sample: one factor vs fewer vs the hypothesised k factors. */
export function competingStructures(spec: SampleSpec, random: Random, table: number): Built {
  const style = baseStyle(random, spec.estimator);
  const moments = (spec.items * (spec.items + 1)) / 2;
  const baseline = baselineFor(spec, random);
  const llSat = -spec.n * spec.items * random.between(1.2, 1.6);
  const k = Math.max(2, spec.factors);
  const dfFor = (factors: number) => moments - (2 * spec.items + (factors * (factors - 1)) / 2);
  const good = random.between(1.2, 2.1);
  const models = [
    trueModel(spec, random, "One factor", dfFor(1), good + random.between(2.5, 6), false, llSat, baseline),
    trueModel(spec, random, `${k} correlated factors`, dfFor(k), good + random.between(0.3, 1.2), false, llSat, baseline),
    trueModel(spec, random, `${k} factors, one residual covariance`, dfFor(k) - 1, good, false, llSat, baseline),
  ];
  // the true chi-squares must fall as parameters are freed (nested models)
  models[1].chisq = Math.max(models[1].chisq, models[2].chisq + random.between(2, 14));
  models[0].chisq = Math.max(models[0].chisq, models[1].chisq + (models[0].df - models[1].df) * 2);
  harmoniseScaling(models, random);
  const truth = new Map(models.map((model) => [model.label, model]));
  const shown = models.map((model) => printed(model, style));
  const comparisons: DemoComparison[] = [];
  for (const [i, j] of [[0, 1], [1, 2], [0, 2]] as const) {
    const { method, figures } = differenceFigures(models[i], models[j], style, random);
    comparisons.push(comparison(`${shown[i].label} vs ${shown[j].label}`, shown[i], shown[j], method, figures, `Table ${table}, p. ${random.integer(100, 900)}`, { preferred: "b" }));
  }
  return { truth, style, sample: { label: spec.label, n: spec.n, groups: 1, groupNs: null, models: shown, comparisons } };
}

/** Measurement invariance across groups: configural → metric → scalar → strict. */
export function invarianceSequence(spec: SampleSpec, random: Random, table: number): Built {
  const style = { ...baseStyle(random, spec.estimator), baseline: false, loglikForm: false };
  const g = spec.groups;
  const p = spec.items;
  const k = spec.factors;
  const baseline = baselineFor(spec, random);
  const llSat = -spec.n * p * random.between(1.2, 1.6);
  const configuralDf = g * ((p * (p + 1)) / 2 - 2 * p - (k * (k - 1)) / 2);
  const steps = [
    { label: "Configural", df: configuralDf },
    { label: "Metric", df: configuralDf + (g - 1) * (p - k) },
    { label: "Scalar", df: configuralDf + 2 * (g - 1) * (p - k) },
    { label: "Strict", df: configuralDf + 2 * (g - 1) * (p - k) + (g - 1) * p },
  ];
  let chisq = configuralDf * random.between(1.3, 2.0);
  const models = steps.map((step, index) => {
    if (index > 0) chisq += (step.df - steps[index - 1].df) * random.between(1.0, 1.9);
    return trueModel(spec, random, step.label, step.df, chisq / step.df, true, llSat, baseline);
  });
  harmoniseScaling(models, random);
  const truth = new Map(models.map((model) => [model.label, model]));
  const shown = models.map((model) => printed(model, style));
  const groupNs = splitN(spec.n, g, random);
  const comparisons = [1, 2, 3].map((index) => {
    const a = models[index];
    const b = models[index - 1];
    const { figures } = differenceFigures(a, b, style, random);
    figures.dCfi = printedDelta(shown[index].figures.cfi, shown[index - 1].figures.cfi);
    figures.dRmsea = printedDelta(shown[index].figures.rmsea, shown[index - 1].figures.rmsea);
    return comparison(`${a.label} vs ${b.label}`, shown[index], shown[index - 1], "invariance", figures, `Table ${table}`, {
      invarianceClaimed: "yes",
      preferred: "a",
    });
  });
  return { truth, style, sample: { label: spec.label, n: spec.n, groups: g, groupNs, models: shown, comparisons } };
}

/** Non-nested alternatives chosen by information criteria. */
export function alternativeStructures(spec: SampleSpec, random: Random, table: number, nearTie: boolean): Built {
  const style = { ...baseStyle(random, spec.estimator), informationCriteria: true, loglikForm: false };
  const moments = (spec.items * (spec.items + 1)) / 2;
  const baseline = baselineFor(spec, random);
  const llSat = -spec.n * spec.items * random.between(1.2, 1.6);
  const k = Math.max(3, spec.factors);
  const correlated = trueModel(spec, random, "Correlated factors", moments - (2 * spec.items + (k * (k - 1)) / 2), random.between(1.3, 2.2), false, llSat, baseline);
  const higherOrder = trueModel(spec, random, "Higher-order factor", moments - (2 * spec.items + k - 1) - 1, random.between(1.4, 2.4), false, llSat, baseline);
  const bifactor = trueModel(spec, random, "Bifactor", moments - (3 * spec.items), random.between(1.1, 1.8), false, llSat, baseline);
  if (nearTie) {
    // AIC difference under 2: χ²_A − χ²_B − 2(df_A − df_B) within (−2, 2)
    bifactor.chisq = correlated.chisq - 2 * (correlated.df - bifactor.df) + random.between(-1.5, 1.5);
    bifactor.chisq = Math.max(bifactor.chisq, bifactor.df * 0.9);
  }
  const models = [correlated, higherOrder, bifactor];
  const truth = new Map(models.map((model) => [model.label, model]));
  const shown = models.map((model) => printed(model, style));
  const aic = (model: TrueModel) => model.chisq + 2 * model.npar;
  const comparisons = ([[0, 2], [1, 2], [0, 1]] as const).map(([i, j]) => {
    const [a, b] = models[i].df >= models[j].df ? [i, j] : [j, i];
    const preferred = aic(models[a]) <= aic(models[b]) ? "a" : "b";
    const figures: DemoComparison["figures"] = {};
    if (shown[a].figures.aic && shown[b].figures.aic) figures.dAic = fixed(Number(shown[a].figures.aic) - Number(shown[b].figures.aic), 2);
    return comparison(`${models[a].label} vs ${models[b].label}`, shown[a], shown[b], "ic", figures, `Table ${table}`, { nested: "no", preferred });
  });
  return { truth, style, sample: { label: spec.label, n: spec.n, groups: 1, groupNs: null, models: shown, comparisons } };
}

/** A path model compared with its saturated (just-identified, df = 0) version. */
export function saturatedPath(spec: SampleSpec, random: Random, table: number): Built {
  const style = baseStyle(random, "ML");
  const baseline = baselineFor({ ...spec, items: 5 }, random);
  const llSat = -spec.n * 5 * random.between(1.2, 1.6);
  const fiveVariables = { ...spec, items: 5, estimator: "ML" as Estimator };
  const full = trueModel(fiveVariables, random, "Full mediation", 2, random.between(1.5, 6), false, llSat, baseline);
  const saturated = trueModel(fiveVariables, random, "Partial mediation (saturated)", 0, 0, false, llSat, baseline);
  saturated.chisq = 0;
  const truth = new Map([full, saturated].map((model) => [model.label, model]));
  const shown = [printed(full, style), printed(saturated, style)];
  const figures: DemoComparison["figures"] = { dChisq: fixed(full.chisq, 2), dDf: "2", dP: printP(chisqUpperTail(full.chisq, 2)) };
  const comparisons = [comparison("Full vs partial mediation", shown[0], shown[1], "lrt", figures, `Figure ${table}`, { preferred: "b" })];
  return { truth, style, sample: { label: spec.label, n: spec.n, groups: 1, groupNs: null, models: shown, comparisons } };
}

/**
 * Scaling corrections of nested models fitted to the same data move together; the model with more df
 * gets the slightly larger one, which keeps the Satorra–Bentler cd positive as in real output.
 */
function harmoniseScaling(models: TrueModel[], random: Random): void {
  const base = random.between(1.08, 1.3);
  const minDf = Math.min(...models.map((model) => model.df));
  const llBase = random.between(1.1, 1.35);
  const minNpar = Math.min(...models.map((model) => model.npar));
  for (const model of models) {
    model.scaling = base + 0.002 * (model.df - minDf);
    model.loglikScaling = llBase + 0.003 * (model.npar - minNpar);
  }
}

function splitN(n: number, groups: number, random: Random): number[] {
  const shares = Array.from({ length: groups }, () => random.between(0.8, 1.2));
  const total = shares.reduce((sum, share) => sum + share, 0);
  const ns = shares.map((share) => Math.round((n * share) / total));
  ns[groups - 1] += n - ns.reduce((sum, value) => sum + value, 0);
  return ns;
}

/** Restricted minus free of two printed figures, printed with the same decimals. */
export function printedDelta(restricted: string | undefined, free: string | undefined): string | undefined {
  if (!restricted || !free) return undefined;
  const decimals = (restricted.split(".")[1] ?? "").length;
  const value = Number(restricted) - Number(free);
  return printFit(Math.abs(value) < 0.5 * 10 ** -decimals ? 0 : value, decimals);
}
