/**
 * Splits plain e-mail text into text and web links, so the Outbox shows links as links while the
 * message itself stays plain text (its HTML is never shown). Only http and https addresses become
 * links; a trailing full stop, comma, closing bracket or quote belongs to the sentence, not the
 * address. Pure.
 */
export type TextPart = { kind: "text"; text: string } | { kind: "link"; href: string };

const URL_PATTERN = /https?:\/\/[^\s<>"']+/g;
const TRAILING = /[.,;:!?)\]}'"]+$/;

export function linkifyText(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const href = match[0].replace(TRAILING, "");
    const start = match.index;
    if (start > last) parts.push({ kind: "text", text: text.slice(last, start) });
    parts.push({ kind: "link", href });
    last = start + href.length;
  }
  if (last < text.length) parts.push({ kind: "text", text: text.slice(last) });
  return parts;
}
