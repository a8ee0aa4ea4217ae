import { SiteHeader } from "@/components/site-header";
import { currentActor } from "@/server/auth/current";

export default async function FieldLayout({ children }: { children: React.ReactNode }) {
  const actor = await currentActor();
  return (
    <>
      <SiteHeader actor={actor} />
      <main className="mx-auto max-w-5xl px-3 py-4">{children}</main>
    </>
  );
}
