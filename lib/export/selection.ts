import "server-only";
// Which entries an export covers. The search route passes its filters as a Sequelize `where` on
// comparisons and/or papers (or a list of paper ids); `scope` decides visibility and is never optional:
// "public" is verified entries only (DESIGN §2), `{ ownerId }` is one contributor's own entries in any
// state. A missing owner can therefore never widen an export to everything.
import { Op, type WhereOptions } from "sequelize";
import { Comparison, Paper } from "@/models";

export type ExportScope = "public" | { ownerId: number };

export interface ExportSelection {
  scope: ExportScope;
  /** only these papers */
  paperIds?: readonly number[];
  /** a filter on papers (e.g. the search page's journal, year or field facets) */
  paperWhere?: WhereOptions<Paper>;
  /** a filter on comparisons (e.g. method); a paper is exported when one of its comparisons matches */
  comparisonWhere?: WhereOptions<Comparison>;
  /** rows read per query (default 500) */
  pageSize?: number;
}

export const DEFAULT_PAGE_SIZE = 500;

export function scopeWhere(scope: ExportScope): WhereOptions<Paper> {
  if (scope === "public") return { state: "verified" };
  if (!Number.isInteger(scope.ownerId) || scope.ownerId <= 0) throw new Error("an owner export needs the owner's id");
  return { createdBy: scope.ownerId };
}

/** The paper filter of a selection: scope, ids and the caller's paper filter, all required together. */
export function paperFilter(selection: ExportSelection): WhereOptions<Paper> {
  const parts: WhereOptions<Paper>[] = [scopeWhere(selection.scope)];
  if (selection.paperIds) parts.push({ id: { [Op.in]: [...selection.paperIds] } });
  if (selection.paperWhere) parts.push(selection.paperWhere);
  return { [Op.and]: parts };
}

/** The ids of the papers a selection covers, in id order. */
export async function selectedPaperIds(selection: ExportSelection): Promise<number[]> {
  const papers = await Paper.findAll({ where: paperFilter(selection), attributes: ["id"], order: [["id", "ASC"]], raw: true });
  const ids = papers.map((paper) => paper.id);
  if (!selection.comparisonWhere || ids.length === 0) return ids;
  const wanted = new Set<number>();
  for (let at = 0; at < ids.length; at += DEFAULT_PAGE_SIZE) {
    const part = ids.slice(at, at + DEFAULT_PAGE_SIZE);
    const rows = await Comparison.findAll({ where: { [Op.and]: [{ paperId: { [Op.in]: part } }, selection.comparisonWhere] }, attributes: ["paperId"], group: ["paperId"], raw: true });
    for (const row of rows) wanted.add(row.paperId as number);
  }
  return ids.filter((id) => wanted.has(id));
}
