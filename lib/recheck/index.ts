// The recheck engine's public surface (DESIGN §4). Pure: no node:* imports, no database, no framework,
// so the same code runs in route handlers, the browser and the command line.
export * from "./types";
export { ENGINE_VERSION, DEFAULT_SETTINGS, resolveSettings } from "./settings";
export { FINDING_CATALOGUE, FINDING_CODES, type FindingCode, type CatalogueEntry } from "./catalogue";
export { readPrintedNumber, readPrintedP, readPrintedInteger, isBlank, type PrintedNumber, type PrintedP, type PRelation } from "./printed";
export { validateComparison, validateModel } from "./parse";
export { recheck, recheckModel } from "./recheck";
export { chisqUpperTail, chisqCdf, chisqDensity, chisqUpperQuantile } from "./distributions/chisq";
export { noncentralChisqCdf, noncentralCdfAtLeast, noncentralityForCdf } from "./distributions/noncentral";
export { logGamma, regularizedGammaP, regularizedGammaQ } from "./distributions/gamma";
