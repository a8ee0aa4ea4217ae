/** Our mark: an open notebook page with a nugget on it. */
export function Wordmark({ compact = false }: { compact?: boolean }) {
  return (
    <span className="inline-flex items-center gap-2 font-bold">
      <svg aria-hidden="true" width={compact ? 28 : 36} height={compact ? 28 : 36} viewBox="0 0 32 32">
        <rect x="2" y="4" width="28" height="24" rx="3" fill="var(--ochre)" />
        <path d="M6 8h9v16H6zM17 8h9v16h-9z" fill="var(--sheet)" />
        <path d="M19 17c1-2 4-2.5 5-.8.9 1.6-.4 3.8-2.6 3.8-1.8 0-3.2-1.3-2.4-3z" fill="#d9a520" stroke="var(--ink)" strokeWidth="0.8" />
        <path d="M8 12h5M8 15h5M8 18h5M8 21h4" stroke="var(--rule)" strokeWidth="1" />
      </svg>
      <span className={compact ? "text-lg" : "text-2xl"}>Lodebook</span>
    </span>
  );
}
