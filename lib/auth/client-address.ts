// The caller's network address, for per-address rate limits. Behind a reverse proxy the proxy must set
// X-Forwarded-For and the app must be reachable only through it; otherwise a client could forge the
// header to dodge the per-address limit (the per-e-mail limit still holds).

type HeaderSource = Headers | Record<string, string | string[] | undefined>;

function header(source: HeaderSource, name: string): string | undefined {
  if (source instanceof Headers) return source.get(name) ?? undefined;
  const value = source[name];
  return Array.isArray(value) ? value[0] : value;
}

export function clientAddressFrom(source: HeaderSource): string {
  const forwarded = header(source, "x-forwarded-for")?.split(",")[0]?.trim();
  if (forwarded) return forwarded.slice(0, 100);
  const real = header(source, "x-real-ip")?.trim();
  return real ? real.slice(0, 100) : "unknown";
}
