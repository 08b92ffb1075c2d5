// The finding catalogue, the default settings and the rules of thumb, each with its source.
import { describe, expect, it } from "vitest";
import { DEFAULT_SETTINGS, ENGINE_VERSION, FINDING_CATALOGUE, FINDING_CODES, recheck, resolveSettings } from "@/lib/recheck";
import { comparisonInput } from "./reference";

// DESIGN §4.3's table, code → severity (scaled-difference-mismatch: warning, raised to error when the
// conclusion changes). criteria-disagree is Fitledger's own note for the table's "the disagreement
// itself is worth a note".
const DESIGN_TABLE: Record<string, string> = {
  "restricted-model-order": "warning",
  "just-identified-model": "error",
  "negative-df": "error",
  "df-difference-mismatch": "error",
  "zero-df-difference": "error",
  "chisq-difference-mismatch": "warning",
  "negative-chisq-difference": "error",
  "difference-p-mismatch": "warning",
  "difference-conclusion-changed": "error",
  "halved-p": "warning",
  "unscaled-robust-difference": "error",
  "scaled-difference-mismatch": "warning",
  "negative-scaling-correction": "warning",
  "model-p-mismatch": "warning",
  "model-conclusion-changed": "error",
  "rmsea-mismatch": "warning",
  "rmsea-interval-mismatch": "warning",
  "cfi-mismatch": "warning",
  "tli-mismatch": "warning",
  "df-recount-mismatch": "warning",
  "information-criteria-inconsistent": "warning",
  "preferred-model-contradicts-criteria": "warning",
  "criteria-near-tie": "note",
  "lrt-on-non-nested": "error",
  "poor-fit-both": "note",
  "invariance-cutoff-exceeded": "warning",
  "delta-fit-mismatch": "warning",
  "p-printed-as-zero": "note",
};

describe("FINDING_CATALOGUE", () => {
  it("holds every code of the DESIGN §4.3 table with its severity", () => {
    for (const [code, severity] of Object.entries(DESIGN_TABLE)) {
      expect(FINDING_CATALOGUE[code as keyof typeof FINDING_CATALOGUE]?.severity, code).toBe(severity);
    }
    expect([...FINDING_CODES].sort()).toEqual([...Object.keys(DESIGN_TABLE), "criteria-disagree"].sort());
  });

  it("gives every code a title, a plain-language explanation and a source", () => {
    for (const code of FINDING_CODES) {
      const entry = FINDING_CATALOGUE[code];
      expect(entry.title.length, code).toBeGreaterThan(5);
      expect(entry.explanation.length, code).toBeGreaterThan(40);
      expect(entry.source.length, code).toBeGreaterThan(5);
    }
  });

  it("codes are stable kebab-case", () => {
    for (const code of FINDING_CODES) expect(code).toMatch(/^[a-z]+(-[a-z]+)*$/);
  });

  it("names the published sources the design gives", () => {
    expect(FINDING_CATALOGUE["halved-p"].source).toContain("Bakker & Wicherts (2011)");
    expect(FINDING_CATALOGUE["unscaled-robust-difference"].source).toContain("Satorra & Bentler (2001)");
    expect(FINDING_CATALOGUE["rmsea-interval-mismatch"].source).toContain("Browne & Cudeck (1993)");
    expect(FINDING_CATALOGUE["invariance-cutoff-exceeded"].source).toContain("Cheung & Rensvold (2002)");
    expect(FINDING_CATALOGUE["invariance-cutoff-exceeded"].source).toContain("Chen (2007)");
    expect(FINDING_CATALOGUE["criteria-near-tie"].source).toContain("Burnham & Anderson (2002)");
    expect(FINDING_CATALOGUE["poor-fit-both"].source).toContain("common practice");
  });
});

describe("settings and rules of thumb", () => {
  it("ENGINE_VERSION is semver, starting at 1.0.0", () => {
    expect(ENGINE_VERSION).toMatch(/^\d+\.\d+\.\d+$/);
  });

  it("alpha .05 by default (common practice)", () => {
    expect(DEFAULT_SETTINGS.alpha).toBe(0.05);
  });

  it("fit cutoffs RMSEA ≤ .08 and CFI ≥ .90 (common practice, no single source)", () => {
    expect(DEFAULT_SETTINGS.fitCutoffs).toEqual({ rmseaMax: 0.08, cfiMin: 0.9 });
  });

  it("invariance cutoffs ΔCFI ≤ −.01 (published rule: Cheung & Rensvold 2002) and ΔRMSEA ≥ .015 (published rule: Chen 2007)", () => {
    expect(DEFAULT_SETTINGS.invarianceCutoffs).toEqual({ dCfi: -0.01, dRmsea: 0.015 });
  });

  it("AIC near tie |ΔAIC| < 2 (published rule of thumb: Burnham & Anderson 2002)", () => {
    expect(DEFAULT_SETTINGS.aicNearTie).toBe(2);
  });

  it("an admin's override changes the outcome: with RMSEA ≤ .15 the CFA models no longer both misfit", () => {
    const input = comparisonInput("hs2_vs_hs3_ML", 3);
    const codes = (s?: Parameters<typeof recheck>[1]) => {
      const outcome = recheck(input, s);
      return outcome.ok ? outcome.result.findings.map((f) => f.code) : [];
    };
    expect(codes()).toContain("poor-fit-both");
    expect(codes({ fitCutoffs: { rmseaMax: 0.15, cfiMin: 0.8 } })).not.toContain("poor-fit-both");
    expect(resolveSettings({ fitCutoffs: { rmseaMax: 0.1, cfiMin: 0.9 } }).invarianceCutoffs).toEqual(DEFAULT_SETTINGS.invarianceCutoffs);
  });

  it("a per-comparison alpha overrides the default: p = .03 is significant at .05 but not at .01", () => {
    const input = { ...comparisonInput("mi_strict_vs_scalar_ML", 3) };
    // Δχ² = 17.409 on 9 df: p = .0427
    const changed = (alpha: string, dP: string) => {
      const outcome = recheck({ ...input, alpha, dP });
      return outcome.ok && outcome.result.findings.some((f) => f.code === "difference-conclusion-changed");
    };
    expect(changed(".05", "> .05")).toBe(true);
    expect(changed(".01", "> .01")).toBe(false);
  });
});
