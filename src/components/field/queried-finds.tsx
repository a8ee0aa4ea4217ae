"use client";
import { IntentLink } from "@/components/intent-link";
import type { LocalFind } from "@/client/device-db";
import { KIND_LABELS } from "@/lib/entities/constants";
import { formatDay } from "@/lib/format";

/** On Today: the finds an officer has queried and the member has not answered yet, each a link to answer it. */
export function QueriedFinds({ finds: shown }: { finds: LocalFind[] }) {
  if (shown.length === 0) return null;
  return (
    <section className="sheet flex flex-col gap-2 border-rust" aria-labelledby="queried-title" data-testid="queried-finds">
      <h2 id="queried-title" className="text-lg font-bold text-rust">
        The club queried {shown.length === 1 ? "a find" : `${shown.length} finds`} of yours
      </h2>
      <ul className="flex flex-col gap-1">
        {shown.map((f) => (
          <li key={f.id}>
            <IntentLink href={`/finds/view#id=${f.id}`}>
              {KIND_LABELS[f.kind]} of {formatDay(f.foundAt)}: read the question and answer it
            </IntentLink>
          </li>
        ))}
      </ul>
    </section>
  );
}
