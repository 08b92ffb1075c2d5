// The sheet's `authors` cell ↔ the CSL name list stored on a paper (DESIGN §3). One written form, so that
// export → import gives back the same names: "Family, Given; Family, Given", and a name without a comma
// (an organisation, a mononym) as a literal. Particles and suffixes fold into the family or given part.
import type { CslName } from "@/models/paper";

export function parseAuthors(text: string): CslName[] {
  const names: CslName[] = [];
  for (const part of text.split(";")) {
    const name = part.trim();
    if (name === "") continue;
    const comma = name.indexOf(",");
    if (comma < 0) {
      names.push({ literal: name });
      continue;
    }
    const family = name.slice(0, comma).trim();
    const given = name.slice(comma + 1).trim();
    names.push(given === "" ? { family } : { family, given });
  }
  return names;
}

function nameText(name: CslName): string {
  if (name.literal) return name.literal;
  const family = [name["non-dropping-particle"], name.family].filter(Boolean).join(" ");
  const given = [name.given, name["dropping-particle"]].filter(Boolean).join(" ");
  const withSuffix = name.suffix ? `${given}${given ? ", " : ""}${name.suffix}` : given;
  return withSuffix ? `${family}, ${withSuffix}` : family;
}

export function formatAuthors(names: readonly CslName[] | null | undefined): string {
  return (names ?? []).map(nameText).filter((text) => text !== "").join("; ");
}
