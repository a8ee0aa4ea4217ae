/** What a waiting screen shows: the shape of what is coming, never a blank. */
export function Skeleton({ lines = 3, label = "Loading" }: { lines?: number; label?: string }) {
  return (
    <div role="status" aria-label={label} className="flex flex-col gap-3">
      {Array.from({ length: lines }, (_, i) => (
        <div key={i} className="sheet h-16 animate-pulse opacity-60" />
      ))}
    </div>
  );
}
