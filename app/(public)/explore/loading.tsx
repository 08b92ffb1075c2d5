export default function ExploreLoading() {
  return (
    <p role="status" className="text-ink-faint">
      Loading the search…
    </p>
  );
}
