/** A short caution of the trade, with the local authority as the last word. */
export function Caution({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <aside className="rounded-md border-2 border-caution p-3 text-sm" role="note">
      <p className="font-bold text-caution">{title}</p>
      <div className="text-ink">{children}</div>
    </aside>
  );
}
