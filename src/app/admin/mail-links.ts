/** A run of mail text: plain, or a link to show as one. */
export interface TextPart {
  text: string;
  /** Set for http(s) links only; anything else stays plain text. */
  href?: string;
}

const LINK = /https?:\/\/[^\s<>"']+/g;
/** Sentence punctuation that usually ends a sentence rather than a URL. */
const TRAILING = /[.,;:!?)\]]+$/;

/** Splits plain mail text into text and links, in order. Pure. */
export function splitLinks(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const match of text.matchAll(LINK)) {
    const start = match.index;
    const href = match[0].replace(TRAILING, '');
    if (start > last) parts.push({ text: text.slice(last, start) });
    parts.push({ text: href, href });
    last = start + href.length;
  }
  if (last < text.length) parts.push({ text: text.slice(last) });
  return parts;
}
