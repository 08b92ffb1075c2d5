import type { RecheckSettings } from "./types";

/** Bumped whenever a rule changes (DESIGN §4.4): a full recheck then rewrites every stored flag. */
export const ENGINE_VERSION = "1.0.0";

export const DEFAULT_SETTINGS: Readonly<RecheckSettings> = Object.freeze({
  alpha: 0.05,
  // Common practice (no single source): RMSEA ≤ .08 "acceptable" (Browne & Cudeck 1993 call .08 a
  // reasonable error of approximation), CFI ≥ .90 the traditional cutoff (Bentler 1990 era; Hu & Bentler
  // 1999 argue for .95).
  fitCutoffs: Object.freeze({ rmseaMax: 0.08, cfiMin: 0.9 }),
  // Published rules: ΔCFI ≤ −.01 (Cheung & Rensvold 2002), ΔRMSEA ≥ .015 (Chen 2007).
  invarianceCutoffs: Object.freeze({ dCfi: -0.01, dRmsea: 0.015 }),
  // |ΔAIC| < 2: "substantial support" for both models (Burnham & Anderson 2002, §2.6).
  aicNearTie: 2,
}) as Readonly<RecheckSettings>;

/** Merges a partial override over the defaults (nested cutoff objects merged field by field). */
export function resolveSettings(settings?: Partial<RecheckSettings>): RecheckSettings {
  if (settings === undefined) return DEFAULT_SETTINGS as RecheckSettings;
  return {
    alpha: settings.alpha ?? DEFAULT_SETTINGS.alpha,
    fitCutoffs: { ...DEFAULT_SETTINGS.fitCutoffs, ...settings.fitCutoffs },
    invarianceCutoffs: { ...DEFAULT_SETTINGS.invarianceCutoffs, ...settings.invarianceCutoffs },
    aicNearTie: settings.aicNearTie ?? DEFAULT_SETTINGS.aicNearTie,
  };
}
