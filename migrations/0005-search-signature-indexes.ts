import type { QueryInterface } from "sequelize";

// Explore/Insights (issue 7): the search index is rebuilt when a signature of the data changes
// (lib/db/queries/search.ts). Its MAX(updated_at) reads need these indexes to stay a B-tree lookup
// instead of a scan of every paper and every disposition on each search.

export async function up({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.addIndex("papers", ["updated_at"], { name: "papers_updated_at" });
  await queryInterface.addIndex("flag_dispositions", ["updated_at"], { name: "flag_dispositions_updated_at" });
}

export async function down({ context: queryInterface }: { context: QueryInterface }): Promise<void> {
  await queryInterface.removeIndex("papers", "papers_updated_at");
  await queryInterface.removeIndex("flag_dispositions", "flag_dispositions_updated_at");
}
