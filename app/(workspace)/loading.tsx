export default function Loading() {
  return (
    <div aria-busy="true" aria-label="Loading" className="space-y-4">
      <div className="h-8 w-64 animate-pulse rounded bg-paper-sunk" />
      <div className="h-40 animate-pulse rounded-card bg-paper-sunk" />
    </div>
  );
}
