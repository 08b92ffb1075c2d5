// Builds the plain-text and HTML bodies of a message from one list of blocks, so the two never say
// different things. Every piece of text is escaped for the HTML part: names, reasons and comments are
// user input and may contain markup.

export type Block =
  | string
  | { quote: string; label?: string }
  | { link: string; label: string }
  | { facts: [string, string | null][] };

export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

const HTML_ESCAPES: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (character) => HTML_ESCAPES[character]);
}

/** Header-safe one-liner: control characters (CR/LF among them) become spaces, length is bounded. */
export function oneLine(value: string, max = 200): string {
  const flat = value.replace(/[\u0000-\u001f\u007f]+/g, " ").replace(/\s+/g, " ").trim();
  return flat.length > max ? `${flat.slice(0, max - 1)}…` : flat;
}

function textOf(block: Block): string {
  if (typeof block === "string") return block;
  if ("quote" in block) return `${block.label ? `${block.label}\n` : ""}${block.quote.split("\n").map((line) => `  > ${line}`).join("\n")}`;
  if ("link" in block) return `${block.label}:\n${block.link}`;
  return block.facts.map(([name, value]) => `${name}: ${value ?? "—"}`).join("\n");
}

const PARAGRAPH = 'style="margin:0 0 12px 0"';

function htmlOf(block: Block): string {
  if (typeof block === "string") return `<p ${PARAGRAPH}>${escapeHtml(block)}</p>`;
  if ("quote" in block) {
    const label = block.label ? `<p ${PARAGRAPH}>${escapeHtml(block.label)}</p>` : "";
    const body = escapeHtml(block.quote).replace(/\n/g, "<br>");
    return `${label}<blockquote style="margin:0 0 12px 0;padding:6px 12px;border-left:3px solid #2f5d62;background:#f2f0ea">${body}</blockquote>`;
  }
  if ("link" in block) return `<p ${PARAGRAPH}><a href="${escapeHtml(block.link)}" style="color:#2f5d62">${escapeHtml(block.label)}</a></p>`;
  const rows = block.facts
    .map(([name, value]) => `<tr><th align="left" style="padding:2px 12px 2px 0;color:#4a5258;font-weight:normal">${escapeHtml(name)}</th><td style="padding:2px 0">${escapeHtml(value ?? "—")}</td></tr>`)
    .join("");
  return `<table style="margin:0 0 12px 0;border-collapse:collapse">${rows}</table>`;
}

const SIGNATURE = "— Fitledger, the ledger of reported model comparisons";

export function compose(subject: string, blocks: Block[]): MailContent {
  const cleanSubject = oneLine(subject, 250);
  const text = [...blocks.map(textOf), SIGNATURE].join("\n\n") + "\n";
  const html =
    `<!doctype html><html><body style="font-family:system-ui,sans-serif;font-size:14px;line-height:1.5;color:#1d2327;background:#fbfaf7;padding:16px">` +
    `<div style="max-width:560px">${blocks.map(htmlOf).join("")}<p style="margin:16px 0 0 0;color:#7a8288;font-size:12px">${escapeHtml(SIGNATURE)}</p></div></body></html>`;
  return { subject: cleanSubject, text, html };
}
