import { FieldShell } from "@/components/field/field-shell";

// Who is signed in, asked while the page is still parsing: a device that does not remember its
// member yet (a first visit, cleared storage) draws the screen when the answer comes, and the
// answer then comes before the app's code has even loaded instead of after it has run.
// MemberProvider takes this promise (once) in place of its own request.
const askWhoEarly = `try{window.__lodebookMe=fetch("/api/me",{cache:"no-store",credentials:"same-origin"}).catch(function(){return null})}catch(e){}`;

// Member screens are static shells: they open from the service worker's cache with no
// signal and read everything from this device's database.
export default function FieldLayout({ children }: { children: React.ReactNode }) {
  return (
    <>
      <script dangerouslySetInnerHTML={{ __html: askWhoEarly }} />
      <FieldShell>{children}</FieldShell>
    </>
  );
}
