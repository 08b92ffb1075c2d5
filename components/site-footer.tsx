import { CAUTION_TEXT } from "./caution-notice";

export function SiteFooter() {
  return (
    <footer className="border-t border-rule bg-paper-sunk">
      <div className="mx-auto max-w-6xl px-4 py-4 text-xs text-ink-faint">
        <p>{CAUTION_TEXT} Only entries verified by a curator are public.</p>
      </div>
    </footer>
  );
}
