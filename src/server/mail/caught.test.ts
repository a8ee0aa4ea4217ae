import { describe, expect, it } from "vitest";
import { asReadBy, type CaughtMail } from "./caught";

const link = "http://localhost:3000/api/auth/callback/nodemailer?callbackUrl=%2Fsigned-in&token=12da2a7b&email=tobias%40quillmarsh.example";
const signIn: CaughtMail = {
  id: "1",
  at: "2026-12-05T04:00:00Z",
  from: "club@quillmarsh.example",
  to: ["tobias@quillmarsh.example"],
  subject: "Your Lodebook sign-in link",
  text: `Open this link to sign in to Lodebook. It works once, for 30 minutes.\n\n${link}\n\nIf you did not ask for it, ignore this message.`,
};

describe("caught mail as an officer reads it (asReadBy)", () => {
  it("hides a sign-in link addressed to someone else, keeping the rest of the message", () => {
    const seen = asReadBy(signIn, "marguerite@quillmarsh.example");
    expect(seen.text).not.toContain("token=");
    expect(seen.text).not.toContain("/api/auth/callback/");
    expect(seen.text).toContain("[a sign-in link for tobias@quillmarsh.example: only they can open it, from their own mailbox]");
    expect(seen.text).toContain("It works once, for 30 minutes.");
    expect(seen.subject).toBe(signIn.subject);
  });

  it("shows the reader's own sign-in link whole, whatever the case of the address", () => {
    expect(asReadBy(signIn, "Tobias@QuillMarsh.example").text).toContain(link);
  });

  it("hides every sign-in link in a message, and leaves other links (a find, an invitation) alone", () => {
    const notice = { ...signIn, text: `See http://localhost:3000/finds/view#id=abc and ${link} and ${link.replace("12da", "99ff")}` };
    const seen = asReadBy(notice, "marguerite@quillmarsh.example");
    expect(seen.text).toContain("http://localhost:3000/finds/view#id=abc");
    expect(seen.text.match(/only they can open it/g)).toHaveLength(2);
    expect(seen.text).not.toContain("token=");
  });
});
