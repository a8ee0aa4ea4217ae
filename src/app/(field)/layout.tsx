import { FieldShell } from "@/components/field/field-shell";

// Who is signed in, asked while the page is still parsing: after the screen's own HTML, so the
// parser reaches the header and the screen's head before it stops for a script (placed first,
// it let the first frame paint an empty page and the app's code run before the screen's words
// were even parsed, so the first words came after that code). On a page load (a screen opened or
// reloaded, the app started from the home screen) the answer then comes before the app's code
// has even loaded instead of after it has run; a device that does not remember its member yet
// (cleared storage) draws the screen when it comes. MemberProvider takes this promise (once) in
// place of its own request. Arriving without a page load (from the sign-in page, in the app)
// does not run the script, as React inserts it without running it: the provider asks itself.
const askWhoEarly = `try{window.__lodebookMe=fetch("/api/me",{cache:"no-store",credentials:"same-origin"}).catch(function(){return null})}catch(e){}`;

// Member screens are static shells: they open from the service worker's cache with no
// signal and read everything from this device's database.
export default function FieldLayout({ children }: { children: React.ReactNode }) {
  return (
    <>
      <FieldShell>{children}</FieldShell>
      <script dangerouslySetInnerHTML={{ __html: askWhoEarly }} />
    </>
  );
}
