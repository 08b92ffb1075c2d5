import type { QueryInterface } from "sequelize";
import * as initialSchema from "./0001-initial-schema";
import * as passwordResetTokens from "./0002-password-reset-tokens";
import * as corrections from "./0003-corrections";
import * as importStaging from "./0004-import-staging";
import * as searchSignatureIndexes from "./0005-search-signature-indexes";
import * as sessionsValidAfter from "./0006-sessions-valid-after";

// Every migration, in order. To add one: create `NNNN-what-it-does.ts` exporting up/down, and list it
// here. A static list (instead of a glob) works the same under tsx, vitest and any bundler.
export interface Migration {
  name: string;
  up: (params: { context: QueryInterface }) => Promise<void>;
  down: (params: { context: QueryInterface }) => Promise<void>;
}

export const migrations: Migration[] = [
  { name: "0001-initial-schema", ...initialSchema },
  { name: "0002-password-reset-tokens", ...passwordResetTokens },
  { name: "0003-corrections", ...corrections },
  { name: "0004-import-staging", ...importStaging },
  { name: "0005-search-signature-indexes", ...searchSignatureIndexes },
  { name: "0006-sessions-valid-after", ...sessionsValidAfter },
];
