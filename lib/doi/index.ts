// lib/doi: DOI syntax (pure, also in the browser: import "@/lib/doi/normalise") and resolution (server).
export { DOI_PATTERN, DOI_HINT, normaliseDoi, stripDoi } from "./normalise";
export { resolveDoi, type DoiResolution, type ResolveOptions } from "./resolve";
