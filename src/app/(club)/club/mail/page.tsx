import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/server/auth/current";
import { asReadBy, caughtMailDir, listCaughtMail } from "@/server/mail/caught";

export const metadata: Metadata = { title: "Caught mail" };

/** A message's text with its web addresses as links (http and https only). */
function Linked({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <>
      {parts.map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} className="font-bold underline" rel="noreferrer">
            {part}
          </a>
        ) : (
          part
        ),
      )}
    </>
  );
}

/** Development and demo only: what the local mail catcher received. Absent in production. */
export default async function CaughtMailPage() {
  const actor = await requirePageActor("readCaughtMail", "/club/mail");
  if (!caughtMailDir()) notFound();
  const mail = (await listCaughtMail()).map((m) => asReadBy(m, actor.email));
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Caught mail</h1>
      <p className="text-ink-soft">
        The demo sends no real e-mail: the local catcher keeps every message here. Sign-in links show only in their own addressee&apos;s messages.
      </p>
      {mail.length === 0 && <p>No messages yet.</p>}
      {mail.map((m) => (
        <article key={m.id} className="sheet">
          <h2 className="font-bold">{m.subject}</h2>
          <p className="text-sm text-ink-soft">
            To {m.to.join(", ")} · {m.at}
          </p>
          <pre className="mt-2 whitespace-pre-wrap break-all font-sans text-sm">
            <Linked text={m.text} />
          </pre>
        </article>
      ))}
    </div>
  );
}
