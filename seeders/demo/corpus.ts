// The demo corpus: about 150 invented papers (DOIs under the test prefix 10.5555) with some 600
// reported comparisons, most printed cleanly and a share carrying one planted reporting slip, plus a few
// DOIs that only the fake registry knows (for adding a paper by DOI in the demo).
import type { Estimator } from "@/lib/recheck/types";
import type { EntryState } from "@/models/paper";
import { alternativeStructures, competingStructures, invarianceSequence, saturatedPath, type Built } from "./designs";
import { Random } from "./random";
import { FAMILY_NAMES, GIVEN_NAMES, GROUPINGS, INSTRUMENTS, JOURNALS, POPULATIONS } from "./scenario";
import { SLIPS } from "./slips";
import type { DemoPaper } from "./types";

export const DEMO_PASSWORD = "fitledger-demo";

export const DEMO_ACCOUNTS = [
  { email: "admin@fitledger.test", name: "Ada Kettleby", role: "admin", status: "active", affiliation: "Fitledger project" },
  { email: "curator@fitledger.test", name: "Carys Halvorsen", role: "curator", status: "active", affiliation: "Eskdale Institute of Measurement" },
  { email: "curator2@fitledger.test", name: "Chidi Okonjo", role: "curator", status: "active", affiliation: "Marlow University" },
  { email: "contributor@fitledger.test", name: "Bram Lindqvist", role: "contributor", status: "active", affiliation: "Tarnwood College" },
  { email: "coder.aino@fitledger.test", name: "Aino Rautio", role: "contributor", status: "active", affiliation: "Ostvale School of Health" },
  { email: "reader@fitledger.test", name: "Rasa Pemberton", role: "reader", status: "active", affiliation: "Brennick Review Office" },
  { email: "pending@fitledger.test", name: "Priya Dunmore", role: "contributor", status: "pending", affiliation: "Calder Business School" },
  { email: "suspended@fitledger.test", name: "Soren Vance", role: "contributor", status: "suspended", affiliation: "Whitmoor Survey Society" },
] as const;

const CODERS = ["contributor@fitledger.test", "coder.aino@fitledger.test", "curator2@fitledger.test"];
const BY_DESIGN = new Set(["just-identified-model", "criteria-near-tie"]);

function pickState(random: Random): EntryState {
  const roll = random.next();
  if (roll < 0.6) return "verified";
  if (roll < 0.74) return "submitted";
  if (roll < 0.82) return "returned";
  return "draft";
}

function estimatorFor(random: Random, design: string): Estimator {
  const roll = random.next();
  if (design === "invariance") return roll < 0.45 ? "ML" : roll < 0.8 ? "MLR" : "WLSMV";
  if (design === "alternatives") return roll < 0.8 ? "ML" : "MLR";
  return roll < 0.5 ? "ML" : roll < 0.75 ? "MLR" : roll < 0.9 ? "MLM" : "WLSMV";
}

function authorsFor(random: Random) {
  const families = new Set<(typeof FAMILY_NAMES)[number]>();
  const count = random.integer(1, 4);
  while (families.size < count) families.add(random.pick(FAMILY_NAMES));
  return [...families].map((family) => ({
    family: family.family,
    given: random.pick(GIVEN_NAMES),
    ...(family.particle ? { "non-dropping-particle": family.particle } : {}),
  }));
}

interface PaperPlan {
  index: number;
  design: "competing" | "invariance" | "alternatives" | "saturated";
}

function designFor(index: number, random: Random): PaperPlan["design"] {
  if (index % 30 === 7) return "saturated";
  const roll = random.next();
  return roll < 0.47 ? "competing" : roll < 0.8 ? "invariance" : "alternatives";
}

function buildSamples(plan: PaperPlan, random: Random, instrument: (typeof INSTRUMENTS)[number]): { built: Built[]; title: string } {
  const population = random.pick(POPULATIONS);
  const estimator = estimatorFor(random, plan.design);
  const spec = (label: string, n: number, groups = 1) => ({ label, n, groups, items: instrument.items, factors: instrument.factors, estimator });
  switch (plan.design) {
    case "competing": {
      const twoSamples = random.chance(0.55);
      const built = [competingStructures(spec(twoSamples ? "Calibration sample" : "Sample 1", random.integer(180, 1400)), random, 2)];
      if (twoSamples) built.push(competingStructures(spec("Validation sample", random.integer(180, 900)), random, 3));
      return { built, title: `The factor structure of the ${instrument.name} among ${population}` };
    }
    case "invariance": {
      const grouping = random.pick(GROUPINGS);
      const groups = grouping.groups.length;
      const built = [invarianceSequence(spec(`Pooled sample (${grouping.groups.join(", ")})`, random.integer(300 * groups, 900 * groups), groups), random, 4)];
      return { built, title: `Is ${instrument.construct} measured alike across ${grouping.label}? Invariance of the ${instrument.name}` };
    }
    case "alternatives": {
      const built = [alternativeStructures(spec("Sample 1", random.integer(250, 1600)), random, 2, random.chance(0.3))];
      return { built, title: `Bifactor or higher-order? Competing representations of ${instrument.construct} in ${population}` };
    }
    case "saturated": {
      const built = [saturatedPath(spec("Sample 1", random.integer(150, 700)), random, 1)];
      return { built, title: `How ${instrument.construct} carries over: a mediation model among ${population}` };
    }
  }
}

function plantSlip(built: Built[], random: Random, pending: string[]): string | null {
  const others = Object.keys(SLIPS).filter((code) => !BY_DESIGN.has(code));
  // pending kinds first (so every kind appears), then the rest in a random order
  const codes = [...pending, ...others.map((code) => ({ code, key: random.next() })).sort((x, y) => x.key - y.key).map((entry) => entry.code)];
  for (const code of codes) {
    if (BY_DESIGN.has(code)) continue;
    const target = random.pick(built);
    if (SLIPS[code](target, random)) {
      const at = pending.indexOf(code);
      if (at >= 0) pending.splice(at, 1);
      return code;
    }
  }
  return null;
}

function journalAbbreviation(name: string): string {
  return name
    .split(/\s+/)
    .filter((word) => /^[A-Z]/.test(word))
    .map((word) => word[0].toLowerCase())
    .join("");
}

/** One invented paper; `pending` lists the slip kinds still to be planted somewhere. */
export function generatePaper(index: number, random: Random, pending: string[]): DemoPaper {
  const plan: PaperPlan = { index, design: designFor(index, random) };
  const instrument = random.pick(INSTRUMENTS);
  const { built, title } = buildSamples(plan, random, instrument);
  const slip = random.chance(0.5) ? plantSlip(built, random, pending) : null;
  const journal = JOURNALS[index % JOURNALS.length];
  const year = 2008 + ((index * 7) % 18);
  const state = pickState(random);
  const coder = CODERS[index % CODERS.length];
  const verifier = state === "verified" ? (coder === "curator2@fitledger.test" ? "curator@fitledger.test" : random.pick(["curator@fitledger.test", "curator2@fitledger.test"])) : null;
  const firstPage = random.integer(1, 900);
  return {
    doi: `10.5555/${journalAbbreviation(journal.name)}.${year}.${String(1000 + index)}`,
    title,
    authors: authorsFor(random),
    journal: journal.name,
    issn: journal.issn,
    year,
    volume: String(year - 1990),
    issue: String(random.integer(1, 6)),
    pages: `${firstPage}–${firstPage + random.integer(8, 30)}`,
    field: journal.field,
    state,
    coder,
    verifier,
    curatorComment: state === "returned" ? "Please check the Δdf of the first comparison against Table 2 and the sample size of the second group." : null,
    samples: built.map((entry) => entry.sample),
    slip,
  };
}

let cached: { papers: DemoPaper[]; registryOnly: DemoPaper[] } | undefined;

/** Deterministic: the same corpus on every machine and every run. */
export function demoCorpus(): { papers: DemoPaper[]; registryOnly: DemoPaper[] } {
  if (cached) return cached;
  const random = new Random(20261201);
  const pending = Object.keys(SLIPS).filter((code) => !BY_DESIGN.has(code));
  const all: DemoPaper[] = [];
  for (let index = 0; index < 176; index += 1) all.push(generatePaper(index, random, pending));
  if (pending.length > 0) throw new Error(`demo corpus: no paper could carry the slip(s) ${pending.join(", ")}`);
  cached = { papers: all.slice(0, 160), registryOnly: all.slice(160) };
  return cached;
}

/** CSL-JSON as a DOI registry would answer it. */
export function cslFor(paper: DemoPaper): Record<string, unknown> {
  return {
    DOI: paper.doi,
    type: "article-journal",
    title: paper.title,
    author: paper.authors,
    "container-title": paper.journal,
    ISSN: [paper.issn],
    issued: { "date-parts": [[paper.year]] },
    volume: paper.volume,
    issue: paper.issue,
    page: paper.pages.replace("–", "-"),
    publisher: "Fitledger Demo Press",
    URL: `https://doi.org/${paper.doi}`,
  };
}

/** Every demo DOI the fake registry answers, seeded or not. */
export function demoRegistryRecords(): Map<string, Record<string, unknown>> {
  const { papers, registryOnly } = demoCorpus();
  return new Map([...papers, ...registryOnly].map((paper) => [paper.doi.toLowerCase(), cslFor(paper)]));
}
