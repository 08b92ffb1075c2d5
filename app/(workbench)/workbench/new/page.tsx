import type { Metadata } from "next";
import { NewPaperForm } from "./new-paper-form";

export const metadata: Metadata = { title: "New paper" };

export default function NewPaperPage() {
  return (
    <div className="space-y-4">
      <header>
        <h1 className="text-xl font-semibold tracking-tight">A new paper</h1>
        <p className="text-ink-soft">Start from its DOI, from a BibTeX or RIS record, or type the metadata yourself. A DOI already in the corpus opens the existing entry.</p>
      </header>
      <NewPaperForm />
    </div>
  );
}
