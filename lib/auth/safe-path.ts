/** Only paths on this site: an absolute URL elsewhere could send a person to a look-alike page. */
export function safeLocalPath(value: string | null | undefined, fallback = "/workbench"): string {
  if (!value || !value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return fallback;
  return value;
}
