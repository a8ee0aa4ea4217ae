import type { Metadata } from "next";

export const metadata: Metadata = { title: "About" };

/** What Lodebook is and the cautions of the trade: a plain page with no scripts of its own. */
export default function AboutPage() {
  return (
    <article className="sheet flex flex-col gap-3">
      <h1 className="text-2xl font-bold">About Lodebook</h1>
      <p>
        Lodebook is the field logbook and production ledger of a small gold prospecting club: members log outings, finds and specimen weigh-ins on the claim,
        with or without signal, and the club&apos;s officers review production by claim and season.
      </p>
      <h2 className="heading-bar self-start text-lg">Cautions</h2>
      <ul className="list-disc pl-5">
        <li>An estimate from hydrostatic weighing is not an assay. Do not buy or sell on it alone.</li>
        <li>Claim boundaries shown here are the club&apos;s drawing, not a survey. Claim rules differ by country, state and land agency.</li>
        <li>Stay out of old mine workings, watch dry washes for flash floods, carry water, and tell someone your plan.</li>
      </ul>
    </article>
  );
}
