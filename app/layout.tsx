import type { Metadata } from "next";
import type { ReactNode } from "react";
import { SiteFooter } from "@/components/site-footer";
import { SiteHeader } from "@/components/site-header";
import { plexSans } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Fitledger", template: "%s · Fitledger" },
  description: "A curated ledger of the model comparisons reported in SEM and CFA papers, each test recomputed from the printed numbers.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={plexSans.variable}>
      <body className="flex min-h-screen flex-col font-sans text-sm">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-paper-raised focus:p-2">
          Skip to content
        </a>
        <SiteHeader />
        <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-6">
          {children}
        </main>
        <SiteFooter />
      </body>
    </html>
  );
}
