import { simpleParser } from "mailparser";
import fs from "node:fs";
import path from "node:path";
import { SMTPServer } from "smtp-server";

/**
 * A local SMTP catcher for development, the demo and tests: accepts any credentials on
 * loopback and writes each message as JSON into `dir`, where the caught-mail page reads it.
 */
export function startMailCatcher(opts: { port: number; dir: string }): Promise<{ close: () => Promise<void> }> {
  fs.mkdirSync(opts.dir, { recursive: true });
  let counter = 0;
  const server = new SMTPServer({
    secure: false,
    disabledCommands: ["STARTTLS"],
    authOptional: true,
    allowInsecureAuth: true,
    logger: false,
    onAuth(_auth, _session, callback) {
      callback(null, { user: "catcher" });
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const id = `${Date.now()}-${String(++counter).padStart(4, "0")}`;
          const record = {
            id,
            at: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
          };
          fs.writeFileSync(path.join(opts.dir, `${id}.json`), JSON.stringify(record, null, 2));
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, "127.0.0.1", () => resolve({ close: () => new Promise<void>((done) => server.close(() => done())) }));
  });
}
