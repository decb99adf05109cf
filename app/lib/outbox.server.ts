/** The local SMTP fake's spool (MAIL_SPOOL_DIR): one JSON file per message, read by the admin Outbox. */
import fs from "node:fs/promises";
import path from "node:path";

export interface SpooledMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

export function spoolDir(): string | null {
  return process.env.MAIL_SPOOL_DIR || null;
}

/** Newest first. Files that cannot be read or parsed are skipped, not fatal. */
export async function readOutbox(
  o: { limit?: number; to?: string } = {},
): Promise<{ configured: boolean; total: number; messages: SpooledMessage[] }> {
  const dir = spoolDir();
  if (!dir) return { configured: false, total: 0, messages: [] };
  let names: string[];
  try {
    names = (await fs.readdir(dir)).filter((n) => n.endsWith(".json"));
  } catch {
    return { configured: true, total: 0, messages: [] };
  }
  // File names start with the arrival time in milliseconds.
  names.sort((a, b) => Number.parseInt(b, 10) - Number.parseInt(a, 10) || b.localeCompare(a));
  const messages: SpooledMessage[] = [];
  const want = o.to?.toLowerCase();
  for (const name of names) {
    if (messages.length >= (o.limit ?? 50)) break;
    try {
      const m = JSON.parse(await fs.readFile(path.join(dir, name), "utf8")) as SpooledMessage;
      if (want && !m.to.some((t) => t.toLowerCase() === want)) continue;
      messages.push({
        id: String(m.id),
        receivedAt: String(m.receivedAt),
        from: String(m.from ?? ""),
        to: (m.to ?? []).map(String),
        subject: String(m.subject ?? ""),
        text: String(m.text ?? ""),
        html: String(m.html ?? ""),
      });
    } catch {
      // A message still being written, or not one of ours.
    }
  }
  return { configured: true, total: names.length, messages };
}
