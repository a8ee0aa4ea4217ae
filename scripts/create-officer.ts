import { count } from "drizzle-orm";
import { parseArgs } from "node:util";
import { v7 as uuidv7 } from "uuid";
import { z } from "zod";
import { closeDb, getDb } from "../src/server/db";
import { members } from "../src/server/db/schema";
import { hashPassword } from "../src/server/auth/password";
import { applyLocalDefaults } from "./lib/env";

// Creates the first officer of an empty club: npm run officer:create -- --email a@b.c --name "A B" --password ...
const { values } = parseArgs({ options: { email: { type: "string" }, name: { type: "string" }, password: { type: "string" } } });
const input = z
  .object({
    email: z.email("--email must be an e-mail address"),
    name: z.string().min(1, "--name is required"),
    password: z.string().min(10, "--password needs at least 10 characters"),
  })
  .safeParse(values);
if (!input.success) {
  console.error(input.error.issues.map((i) => i.message).join("\n"));
  process.exit(2);
}
applyLocalDefaults();
const db = getDb();
const existing = db.select({ n: count() }).from(members).get();
if (existing && existing.n > 0) {
  console.error("The club already has members: invite officers from the club console instead.");
  process.exit(1);
}
db.insert(members)
  .values({
    id: uuidv7(),
    email: input.data.email.toLowerCase(),
    name: input.data.name,
    role: "officer",
    passwordHash: await hashPassword(input.data.password),
  })
  .run();
closeDb();
console.log(`Officer ${input.data.email} created.`);
