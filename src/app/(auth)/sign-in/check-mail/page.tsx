export default function CheckMailPage() {
  return (
    <section className="sheet flex flex-col gap-3">
      <h1 className="text-2xl font-bold">Check your e-mail</h1>
      <p>If that address belongs to a club member, a sign-in link is on its way. It works once, for 30 minutes.</p>
      <a href="/sign-in" className="btn">
        Back to sign-in
      </a>
    </section>
  );
}
