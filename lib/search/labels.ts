// Words for facet values, shared by Explore, Insights and the digest. Plain data (browser-safe).
import { FINDING_CATALOGUE, type FindingCode } from "@/lib/recheck/catalogue";

export const METHOD_LABELS: Record<string, string> = {
  lrt: "χ² difference test",
  scaled_lrt: "Scaled χ² difference",
  ic: "Information criteria",
  invariance: "Invariance step",
};

export const DISPOSITION_LABELS: Record<string, string> = {
  confirmed: "Confirmed reporting error",
  coding_error: "Coding error (fixed)",
  explained: "Explained (erratum, reply)",
  engine_limitation: "Engine limitation",
  none: "Not yet ruled on",
};

export const STATE_LABELS: Record<string, string> = {
  draft: "Draft",
  submitted: "Submitted",
  returned: "Returned",
  verified: "Verified",
};

export const SEVERITY_LABELS: Record<string, string> = { error: "Error", warning: "Warning", note: "Note" };

export function findingTitle(code: string): string {
  return FINDING_CATALOGUE[code as FindingCode]?.title ?? code;
}

export function groupsLabel(groups: number): string {
  return groups === 1 ? "1 group" : `${groups} groups`;
}
