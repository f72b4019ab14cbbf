/** What the developer mail page and the tests need from a caught message. */
export type CaughtMail = { to: string; from: string; subject: string; date: string; text: string; html: string; attachments: string[] };

type Part = { headers: Map<string, string>; body: string };

/**
 * Reads a raw RFC 5322 message (as nodemailer writes it) just far enough to show it: the main
 * headers (RFC 2047 encoded words decoded), the text and HTML parts (quoted-printable or base64),
 * and attachment file names. Not a general MIME parser.
 */
export function readEml(raw: string): CaughtMail {
  const top = splitPart(raw);
  const parts: Part[] = [];
  collectParts(top, parts);
  const leaf = (type: string) => parts.find((p) => contentType(p).startsWith(type) && !isAttachment(p));
  const text = leaf('text/plain');
  const html = leaf('text/html');
  return {
    to: decodeWords(top.headers.get('to') ?? ''),
    from: decodeWords(top.headers.get('from') ?? ''),
    subject: decodeWords(top.headers.get('subject') ?? ''),
    date: top.headers.get('date') ?? '',
    text: text ? decodeBody(text) : '',
    html: html ? decodeBody(html) : '',
    attachments: parts.filter(isAttachment).map((p) => /filename="?([^";]+)"?/i.exec(p.headers.get('content-disposition') ?? '')?.[1] ?? 'attachment'),
  };
}

/** The attachments of a raw message with their decoded bytes (for the tests that open sent files). */
export function readEmlAttachments(raw: string): { filename: string; contentType: string; content: Buffer }[] {
  const parts: Part[] = [];
  collectParts(splitPart(raw), parts);
  return parts.filter(isAttachment).map((part) => ({
    filename: /filename="?([^";]+)"?/i.exec(part.headers.get('content-disposition') ?? '')?.[1] ?? 'attachment',
    contentType: contentType(part).split(';')[0]!.trim(),
    content: decodeBytes(part),
  }));
}

function splitPart(raw: string): Part {
  const normalized = raw.replace(/\r\n/g, '\n');
  const end = normalized.indexOf('\n\n');
  const head = end < 0 ? normalized : normalized.slice(0, end);
  const body = end < 0 ? '' : normalized.slice(end + 2);
  const headers = new Map<string, string>();
  for (const line of head.replace(/\n[ \t]+/g, ' ').split('\n')) {
    const at = line.indexOf(':');
    if (at > 0) headers.set(line.slice(0, at).trim().toLowerCase(), line.slice(at + 1).trim());
  }
  return { headers, body };
}

function contentType(part: Part): string {
  return (part.headers.get('content-type') ?? 'text/plain').toLowerCase();
}

function isAttachment(part: Part): boolean {
  return /^attachment/i.test(part.headers.get('content-disposition') ?? '');
}

function collectParts(part: Part, into: Part[]): void {
  const type = part.headers.get('content-type') ?? '';
  const boundary = /boundary="?([^";]+)"?/i.exec(type)?.[1];
  if (!/^multipart\//i.test(type) || !boundary) {
    into.push(part);
    return;
  }
  const pieces = part.body.split(`--${boundary}`);
  for (const piece of pieces.slice(1)) {
    if (piece.startsWith('--')) break;
    collectParts(splitPart(piece.replace(/^\n/, '')), into);
  }
}

function decodeBytes(part: Part): Buffer {
  const encoding = (part.headers.get('content-transfer-encoding') ?? '').toLowerCase();
  const body = part.body.replace(/\n$/, '');
  if (encoding === 'base64') return Buffer.from(body.replace(/\s+/g, ''), 'base64');
  if (encoding === 'quoted-printable') return decodeQuotedPrintable(body);
  return Buffer.from(body, 'utf8');
}

function decodeBody(part: Part): string {
  const charset = /charset="?([^";]+)"?/i.exec(part.headers.get('content-type') ?? '')?.[1] ?? 'utf-8';
  return new TextDecoder(charset.toLowerCase() === 'us-ascii' ? 'utf-8' : charset).decode(decodeBytes(part));
}

function decodeQuotedPrintable(body: string): Buffer {
  const joined = body.replace(/=\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < joined.length; i++) {
    const hex = joined.slice(i + 1, i + 3);
    if (joined[i] === '=' && /^[0-9A-F]{2}$/i.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      bytes.push(...Buffer.from(joined[i]!, 'utf8'));
    }
  }
  return Buffer.from(bytes);
}

/** RFC 2047 encoded words, `=?utf-8?Q?…?=` and `=?utf-8?B?…?=`. */
function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QB])\?([^?]*)\?=/gi, (_match, charset: string, kind: string, data: string) => {
      const bytes = kind.toUpperCase() === 'B' ? Buffer.from(data, 'base64') : decodeQuotedPrintable(data.replace(/_/g, ' '));
      return new TextDecoder(charset).decode(bytes);
    });
}
