export default function InsightsLoading() {
  return (
    <p role="status" className="text-ink-faint">
      Counting the corpus…
    </p>
  );
}
