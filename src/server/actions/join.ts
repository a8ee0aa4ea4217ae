"use server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { defineAction } from "../action";
import { acceptInvitation, openInvitation } from "../club/members";
import { clubSettings } from "../club/settings";
import { clientAddress } from "../client-address";
import { AppError } from "../errors";
import { spend } from "../limits";

const joinForm = z
  .object({
    token: z.string().min(20, "This link is incomplete.").max(100),
    name: z
      .string()
      .trim()
      .min(1, "Tell the club your name.")
      .max(120, "At most 120 characters.")
      // A name is shown in mail, reports and exports: no line breaks, no invisible controls.
      .refine((n) => !/[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028-\u202e\u2066-\u2069]/.test(n), "Use letters, spaces and punctuation only."),
    password: z.string().min(10, "Use at least 10 characters.").max(200),
    confirm: z.string(),
  })
  .refine((f) => f.password === f.confirm, { message: "The two passwords differ.", path: ["confirm"] });

/** Accepting an invitation: public (the link is the key), and it works once. */
export const joinClub = defineAction({ public: true }, joinForm, async (input) => {
  try {
    await spend([["joinPerAddress", clientAddress(await headers())]]);
    await acceptInvitation(input.token, input.name, input.password);
  } catch (error) {
    if (error instanceof AppError) return { ok: false, message: error.message };
    throw error;
  }
  redirect("/sign-in?joined=1");
});

/**
 * Before the person fills in the form: is this link still good? Public like joining, counted
 * against the same per-address limit, and it says no more than open or not (and the club's
 * name), so it cannot be used to learn addresses.
 */
export const invitationState = defineAction({ public: true }, z.object({ token: z.string().min(1).max(100) }), async (input) => {
  try {
    await spend([["joinPerAddress", clientAddress(await headers())]]);
  } catch (error) {
    if (error instanceof AppError) return { ok: false, message: error.message };
    throw error;
  }
  const open = input.token.length >= 20 && openInvitation(input.token) !== null;
  return open
    ? { ok: true, message: `Welcome to ${clubSettings().name}.` }
    : { ok: false, message: "This invitation link has been used, withdrawn or has run out. Ask an officer for a new one." };
});
