import type { EntryState } from "@/models/paper";
import type { ComparisonFigure, ModelFigure } from "@/models/figures";
import type { Estimator, InvarianceClaim, Method, Nested, Preferred } from "@/lib/recheck/types";

export interface DemoModel {
  label: string;
  estimator: Estimator;
  meanStructure: boolean;
  figures: Partial<Record<ModelFigure, string>>;
}

export interface DemoComparison {
  label: string;
  method: Method;
  nested: Nested;
  restricted: string;
  free: string;
  location: string;
  figures: Partial<Record<ComparisonFigure, string>>;
  preferred: Preferred | null;
  invarianceClaimed: InvarianceClaim;
  notes: string | null;
}

export interface DemoSample {
  label: string;
  n: number;
  groups: number;
  groupNs: number[] | null;
  models: DemoModel[];
  comparisons: DemoComparison[];
}

export interface DemoPaper {
  doi: string;
  title: string;
  authors: { family: string; given: string; "non-dropping-particle"?: string }[];
  journal: string;
  issn: string;
  year: number;
  volume: string;
  issue: string;
  pages: string;
  field: string;
  state: EntryState;
  coder: string;
  verifier: string | null;
  curatorComment: string | null;
  samples: DemoSample[];
  /** the reporting slip planted in this paper, for the demo's own tests */
  slip: string | null;
}
