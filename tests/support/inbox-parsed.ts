/** Messages to an address in the local test inbox, parsed with mailparser, attachments included. */
import fs from "node:fs";
import path from "node:path";
import { simpleParser } from "mailparser";

export async function parsedMessagesTo(address: string) {
  const dir = process.env.MAIL_INBOX_DIR;
  if (!dir) throw new Error("MAIL_INBOX_DIR is not set; run the tests through `npm test`.");
  if (!fs.existsSync(dir)) return [];
  const found = [];
  for (const file of fs.readdirSync(dir)) {
    const parsed = await simpleParser(fs.readFileSync(path.join(dir, file)));
    const to = Array.isArray(parsed.to) ? parsed.to.map((t) => t.text).join(",") : (parsed.to?.text ?? "");
    if (!to.toLowerCase().includes(address.toLowerCase())) continue;
    found.push({
      subject: parsed.subject ?? "",
      text: parsed.text ?? "",
      attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? "", contentType: a.contentType, size: a.size, content: a.content })),
    });
  }
  return found;
}
