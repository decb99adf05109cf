/**
 * Local stand-ins for the hosted services, started by `npm start`, `npm run dev` and `npm test`:
 * an SMTP server that keeps every message (as JSON files in a spool folder the admin Outbox
 * reads) and an S3-compatible object store (s3rver) for underlays.
 */
import fs from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
// @ts-expect-error s3rver ships no types
import S3rver from "s3rver";

export interface FakeOptions {
  smtpPort: number;
  s3Port: number;
  spoolDir: string;
  s3Dir: string;
  bucket: string;
}

export async function startFakes(o: FakeOptions) {
  fs.mkdirSync(o.spoolDir, { recursive: true });
  fs.mkdirSync(o.s3Dir, { recursive: true });
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const id = `${Date.now()}-${randomUUID()}`;
          const to = Array.isArray(mail.to) ? mail.to.flatMap((a) => a.value) : (mail.to?.value ?? []);
          const record = {
            id,
            receivedAt: new Date().toISOString(),
            from: mail.from?.text ?? "",
            to: to.map((a) => a.address ?? ""),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
            html: typeof mail.html === "string" ? mail.html : "",
          };
          // Again per message: a test run starting beside this one may have emptied the spool folder.
          fs.mkdirSync(o.spoolDir, { recursive: true });
          fs.writeFileSync(path.join(o.spoolDir, `${id}.json`), JSON.stringify(record, null, 2));
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(o.smtpPort, "127.0.0.1", () => resolve());
  });
  const s3 = new S3rver({
    port: o.s3Port,
    address: "127.0.0.1",
    silent: true,
    directory: o.s3Dir,
    configureBuckets: [{ name: o.bucket }],
  });
  await s3.run();
  return {
    async close() {
      await new Promise<void>((r) => smtp.close(() => r()));
      await s3.close();
    },
  };
}

// Run directly: `node --import tsx app/dev/fakes.ts` with the ports in the environment.
if (import.meta.url === `file://${process.argv[1]}`) {
  const env = process.env;
  const fakes = await startFakes({
    smtpPort: Number(env.SMTP_PORT ?? 2525),
    s3Port: Number(env.S3_PORT ?? 4568),
    spoolDir: env.MAIL_SPOOL_DIR ?? ".data/mail",
    s3Dir: env.S3_FAKE_DIR ?? ".data/s3",
    bucket: env.S3_BUCKET ?? "fallwright",
  });
  console.log(`[fakes] SMTP on 127.0.0.1:${env.SMTP_PORT ?? 2525}, S3 on 127.0.0.1:${env.S3_PORT ?? 4568}`);
  const stop = async () => {
    await fakes.close();
    process.exit(0);
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}
