export function PageLoading() {
  return (
    <p role="status" className="p-8 text-center text-ink-muted">
      Loading…
    </p>
  );
}
