import "server-only";
import { withoutBidiControls } from "@/lib/text/safe-text";

export function signInLinkMessage(url: string) {
  return {
    subject: "Your Lodebook sign-in link",
    text: `Open this link to sign in to Lodebook. It works once, for 30 minutes.\n\n${url}\n\nIf you did not ask for it, ignore this message: nobody can sign in without the link.`,
    html: `<p>Open this link to sign in to Lodebook. It works once, for 30 minutes.</p><p><a href="${url}">Sign in to Lodebook</a></p><p>If you did not ask for it, ignore this message: nobody can sign in without the link.</p>`,
  };
}

export function invitationMessage(url: string, inviter: string, days: number, club: string) {
  const clubName = withoutBidiControls(club).replace(/[\r\n]+/g, " ");
  return {
    subject: `You are invited to ${clubName}'s Lodebook`,
    text: `${withoutBidiControls(inviter)} invites you to keep your prospecting log in Lodebook, with ${clubName}.\n\nOpen this link to choose your password. It works once, for ${days} days:\n\n${url}\n\nIf you were not expecting this, ignore it.`,
  };
}

/** To a member who asked for it: an officer queried a find of theirs. Text people chose has no bidirectional controls; the subject stays on one line. */
export function queryMessage(q: { link: string; club: string; officer: string | null; note: string; find: string }) {
  const clubName = withoutBidiControls(q.club).replace(/[\r\n]+/g, " ");
  const officer = q.officer ? withoutBidiControls(q.officer).replace(/[\r\n]+/g, " ") : "An officer";
  return {
    subject: `${clubName}: a find of yours was queried`,
    text: `${officer} of ${clubName} queried your ${q.find}:\n\n${withoutBidiControls(q.note)}\n\nOpen the find to answer or correct it; your answer goes to the club at the next camp sync:\n\n${q.link}\n\nYou get this because you asked for it in Lodebook's settings.`,
  };
}
