import "server-only";

export function signInLinkMessage(url: string) {
  return {
    subject: "Your Lodebook sign-in link",
    text: `Open this link to sign in to Lodebook. It works once, for 30 minutes.\n\n${url}\n\nIf you did not ask for it, ignore this message: nobody can sign in without the link.`,
    html: `<p>Open this link to sign in to Lodebook. It works once, for 30 minutes.</p><p><a href="${url}">Sign in to Lodebook</a></p><p>If you did not ask for it, ignore this message: nobody can sign in without the link.</p>`,
  };
}
