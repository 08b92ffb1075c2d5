"use client";

import { useState } from "react";
import type { FacetValue, Facets } from "@/lib/search/engine";
import { DISPOSITION_LABELS, findingTitle, groupsLabel, METHOD_LABELS, SEVERITY_LABELS, STATE_LABELS } from "@/lib/search/labels";
import { formatCount } from "@/lib/format";
import type { SearchFilters } from "@/lib/validation/search";

// The facet column of Explore: one group of checkboxes per facet with the live count of each value
// (what the result count would be with that value chosen), and the year range.

type ListKey = "code" | "severity" | "disposition" | "method" | "estimator" | "journal" | "field" | "state";

function FacetGroup<V extends string | number>({
  legend,
  name,
  values,
  selected,
  label,
  onToggle,
  initiallyShown = 12,
}: {
  legend: string;
  name: string;
  values: FacetValue<V>[];
  selected: V[];
  label: (value: V) => string;
  onToggle: (value: V) => void;
  initiallyShown?: number;
}) {
  const [expanded, setExpanded] = useState(false);
  if (values.length === 0) return null;
  const shown = expanded ? values : values.slice(0, initiallyShown);
  return (
    <fieldset className="space-y-1">
      <legend className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-faint">{legend}</legend>
      <ul className="space-y-0.5">
        {shown.map((facet) => {
          const id = `facet-${name}-${String(facet.value).replace(/[^a-z0-9]+/gi, "-")}`;
          const checked = selected.includes(facet.value);
          return (
            <li key={String(facet.value)} className="flex items-start gap-1.5">
              {/* uncontrolled, re-mounted when the address changes: the box flips at once while the new address loads */}
              <input key={String(checked)} id={id} type="checkbox" className="mt-0.5 accent-ledger" defaultChecked={checked} onChange={() => onToggle(facet.value)} disabled={!checked && facet.count === 0} />
              <label htmlFor={id} className="flex flex-1 justify-between gap-2 text-xs">
                <span className={facet.count === 0 && !checked ? "text-ink-faint" : "text-ink"}>{label(facet.value)}</span>
                <span className="figures text-ink-faint" aria-label={`${facet.count} comparisons`}>
                  {formatCount(facet.count)}
                </span>
              </label>
            </li>
          );
        })}
      </ul>
      {values.length > initiallyShown ? (
        <button type="button" className="text-xs text-ledger hover:underline" onClick={() => setExpanded(!expanded)} aria-expanded={expanded}>
          {expanded ? "Show fewer" : `Show all ${values.length}`}
        </button>
      ) : null}
    </fieldset>
  );
}

function YearRange({ filters, years, onApply }: { filters: SearchFilters; years: FacetValue<number>[]; onApply: (from?: number, to?: number) => void }) {
  const first = years[0]?.value;
  const last = years.at(-1)?.value;
  const read = (value: FormDataEntryValue | null) => (typeof value === "string" && value.trim() !== "" ? Number(value) : undefined);
  return (
    <form
      key={`${filters.yearFrom ?? ""}-${filters.yearTo ?? ""}`}
      className="space-y-1"
      onSubmit={(event) => {
        event.preventDefault();
        const data = new FormData(event.currentTarget);
        onApply(read(data.get("year_from")), read(data.get("year_to")));
      }}
    >
      <fieldset>
        <legend className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-faint">Publication year</legend>
        <div className="flex items-end gap-1.5">
          <label className="text-xs">
            <span className="block text-ink-soft">From</span>
            <input name="year_from" type="number" min={1900} max={2100} defaultValue={filters.yearFrom ?? ""} placeholder={first ? String(first) : ""} className="w-20 rounded border border-rule-strong bg-paper-raised px-1.5 py-1 text-xs" />
          </label>
          <label className="text-xs">
            <span className="block text-ink-soft">To</span>
            <input name="year_to" type="number" min={1900} max={2100} defaultValue={filters.yearTo ?? ""} placeholder={last ? String(last) : ""} className="w-20 rounded border border-rule-strong bg-paper-raised px-1.5 py-1 text-xs" />
          </label>
          <button type="submit" className="rounded border border-rule-strong bg-paper-raised px-2 py-1 text-xs hover:bg-paper-sunk">
            Apply
          </button>
        </div>
        {first !== undefined ? (
          <p className="mt-1 text-xxs text-ink-faint">
            Results span {first}–{last}.
          </p>
        ) : null}
      </fieldset>
    </form>
  );
}

export function ExploreFacets({ facets, filters, onChange }: { facets: Facets; filters: SearchFilters; onChange: (filters: SearchFilters) => void }) {
  const toggle = <K extends ListKey>(key: K) => (value: string) => {
    const current = filters[key] as string[];
    onChange({ ...filters, [key]: current.includes(value) ? current.filter((item) => item !== value) : [...current, value] });
  };
  const toggleGroups = (value: number) => onChange({ ...filters, groups: filters.groups.includes(value) ? filters.groups.filter((item) => item !== value) : [...filters.groups, value] });
  return (
    <div className="space-y-5">
      {facets.state ? <FacetGroup legend="Entry state" name="state" values={facets.state} selected={filters.state.length ? filters.state : filters.mine ? [] : ["verified"]} label={(value) => STATE_LABELS[value] ?? value} onToggle={toggle("state")} /> : null}
      <FacetGroup legend="Severity" name="severity" values={facets.severity} selected={filters.severity} label={(value) => SEVERITY_LABELS[value] ?? value} onToggle={toggle("severity")} />
      <FacetGroup legend="Finding" name="code" values={facets.code} selected={filters.code} label={findingTitle} onToggle={toggle("code")} initiallyShown={10} />
      <FacetGroup legend="Curator's ruling" name="disposition" values={facets.disposition} selected={filters.disposition} label={(value) => DISPOSITION_LABELS[value] ?? value} onToggle={toggle("disposition")} />
      <FacetGroup legend="Method" name="method" values={facets.method} selected={filters.method} label={(value) => METHOD_LABELS[value] ?? value} onToggle={toggle("method")} />
      <FacetGroup legend="Estimator" name="estimator" values={facets.estimator} selected={filters.estimator} label={(value) => value} onToggle={toggle("estimator")} />
      <FacetGroup legend="Groups" name="groups" values={facets.groups} selected={filters.groups} label={groupsLabel} onToggle={toggleGroups} />
      <YearRange filters={filters} years={facets.year} onApply={(yearFrom, yearTo) => onChange({ ...filters, yearFrom, yearTo })} />
      <FacetGroup legend="Journal" name="journal" values={facets.journal} selected={filters.journal} label={(value) => value} onToggle={toggle("journal")} initiallyShown={8} />
      <FacetGroup legend="Field" name="field" values={facets.field} selected={filters.field} label={(value) => value} onToggle={toggle("field")} initiallyShown={8} />
    </div>
  );
}
