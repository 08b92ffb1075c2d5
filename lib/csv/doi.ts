// DOI syntax and normal form live in lib/doi (the one home); the sheet reader uses them from there.
export { DOI_PATTERN, normaliseDoi } from "@/lib/doi/normalise";
