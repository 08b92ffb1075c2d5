import Link from "next/link";
import { SavedSearchControls } from "@/components/explore-saved-search-controls";
import { listSavedSearches } from "@/lib/db/queries/saved-searches";

/**
 * A reader's saved Explore searches with their alert switch and a delete button. A server component:
 * render it with the signed-in account's id, e.g. `<SavedSearches userId={user.id} />` on /account.
 */
export async function SavedSearches({ userId }: { userId: number }) {
  const searches = await listSavedSearches({ userId });
  if (searches.length === 0) {
    return (
      <p className="text-ink-soft">
        No saved searches yet. Search on <Link href="/explore">Explore</Link> and choose “Save this search”.
      </p>
    );
  }
  return (
    <table className="w-full border-collapse text-left">
      <thead>
        <tr className="border-b border-rule-strong text-xs text-ink-faint">
          <th scope="col" className="py-1.5 pr-3 font-medium">Search</th>
          <th scope="col" className="py-1.5 pr-3 font-medium">Daily e-mail</th>
          <th scope="col" className="py-1.5 pr-3 font-medium">Saved</th>
          <th scope="col" className="py-1.5 font-medium">
            <span className="sr-only">Actions</span>
          </th>
        </tr>
      </thead>
      <tbody>
        {searches.map((search) => (
          <tr key={search.id} className="border-b border-rule align-top">
            <td className="py-1.5 pr-3">
              <Link href={`/explore${search.query ? `?${search.query}` : ""}`}>{search.name}</Link>
              <div className="break-all text-xxs text-ink-faint">{search.query || "(the whole corpus)"}</div>
            </td>
            <td className="py-1.5 pr-3">{search.alerts ? "on" : "off"}</td>
            <td className="figures py-1.5 pr-3">{search.createdAt.toISOString().slice(0, 10)}</td>
            <td className="py-1.5">
              <SavedSearchControls id={search.id} name={search.name} alerts={search.alerts} />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
