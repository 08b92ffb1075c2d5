import "server-only";
// Reads the selected comparisons page by page — papers in id order, a page of comparisons at a time
// with their samples, models and papers fetched by id — so an export of the whole corpus never holds
// more than one page of rows.
import { Op } from "sequelize";
import { Comparison, FitModel, Flag, FlagDisposition, Paper, Sample, User } from "@/models";
import { DEFAULT_PAGE_SIZE, selectedPaperIds, type ExportSelection } from "./selection";

export interface ExportEntry {
  paper: Paper;
  sample: Sample;
  comparison: Comparison;
  restricted: FitModel;
  free: FitModel;
}

export interface ExportPage {
  entries: ExportEntry[];
  /** flags per comparison id, with the curator's verdict when there is one */
  flags: Map<number, { code: string; severity: string; subject: string; message: string; disposition: string | null }[]>;
  /** display names of coders and verifiers */
  people: Map<number, string>;
}

const byId = <T extends { id: number }>(rows: T[]) => new Map(rows.map((row) => [row.id, row]));

export async function* readExportPages(selection: ExportSelection, options: { withFlags?: boolean } = {}): AsyncGenerator<ExportPage> {
  const pageSize = selection.pageSize ?? DEFAULT_PAGE_SIZE;
  const paperIds = await selectedPaperIds(selection);
  // papers are taken a few at a time, and their comparisons in pages of at most pageSize
  for (let at = 0; at < paperIds.length; at += 50) {
    const papersPart = paperIds.slice(at, at + 50);
    let afterId = 0;
    for (;;) {
      const where = { [Op.and]: [{ paperId: { [Op.in]: papersPart } }, { id: { [Op.gt]: afterId } }, ...(selection.comparisonWhere ? [selection.comparisonWhere] : [])] };
      const comparisons = await Comparison.findAll({ where, order: [["id", "ASC"]], limit: pageSize });
      if (comparisons.length === 0) break;
      afterId = comparisons[comparisons.length - 1].id;
      const modelIds = [...new Set(comparisons.flatMap((c) => [c.restrictedModelId, c.freeModelId]))];
      const [models, samples, papers] = await Promise.all([
        FitModel.findAll({ where: { id: { [Op.in]: modelIds } } }),
        Sample.findAll({ where: { id: { [Op.in]: [...new Set(comparisons.map((c) => c.sampleId))] } } }),
        Paper.findAll({ where: { id: { [Op.in]: [...new Set(comparisons.map((c) => c.paperId))] } } }),
      ]);
      const modelById = byId(models);
      const sampleById = byId(samples);
      const paperById = byId(papers);
      const entries: ExportEntry[] = [];
      for (const comparison of comparisons) {
        const restricted = modelById.get(comparison.restrictedModelId);
        const free = modelById.get(comparison.freeModelId);
        const sample = sampleById.get(comparison.sampleId);
        const paper = paperById.get(comparison.paperId);
        if (restricted && free && sample && paper) entries.push({ paper, sample, comparison, restricted, free });
      }
      const page: ExportPage = { entries, flags: new Map(), people: new Map() };
      if (options.withFlags) {
        const ids = comparisons.map((c) => c.id);
        const [flags, dispositions, people] = await Promise.all([
          Flag.findAll({ where: { comparisonId: { [Op.in]: ids } }, attributes: ["comparisonId", "code", "severity", "subject", "message", "fingerprint", "paperId"], order: [["id", "ASC"]], raw: true }),
          FlagDisposition.findAll({ where: { paperId: { [Op.in]: papers.map((p) => p.id) } }, attributes: ["paperId", "fingerprint", "verdict"], raw: true }),
          User.findAll({ where: { id: { [Op.in]: [...new Set(papers.flatMap((p) => [p.createdBy, p.verifiedBy]).filter((id): id is number => typeof id === "number"))] } }, attributes: ["id", "name"], raw: true }),
        ]);
        const verdict = new Map(dispositions.map((d) => [`${d.paperId}:${d.fingerprint}`, d.verdict as string]));
        for (const flag of flags) {
          const list = page.flags.get(flag.comparisonId!) ?? [];
          list.push({ code: flag.code, severity: flag.severity, subject: flag.subject, message: flag.message, disposition: verdict.get(`${flag.paperId}:${flag.fingerprint}`) ?? null });
          page.flags.set(flag.comparisonId!, list);
        }
        for (const person of people) page.people.set(person.id, person.name);
      }
      yield page;
      if (comparisons.length < pageSize) break;
    }
  }
}
