// A small MIME reader for the local mail service: enough to show what Quarterbeat itself sends (subject,
// plain text, attachments) in the outbox. It understands multipart bodies, base64 and quoted-printable,
// encoded-word headers (RFC 2047) and encoded or split parameters (RFC 2231). Anything it cannot read is
// kept as raw bytes in the mailbox row, so nothing is lost.

export interface ParsedAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

export interface ParsedMail {
  subject: string;
  from: string;
  text: string;
  attachments: ParsedAttachment[];
}

interface Part {
  headers: Map<string, string>;
  body: Buffer;
}

const MAX_DEPTH = 8;

export function parseMail(raw: Buffer): ParsedMail {
  const root = splitPart(raw);
  const result: ParsedMail = {
    subject: decodeWords(root.headers.get("subject") ?? ""),
    from: decodeWords(root.headers.get("from") ?? ""),
    text: "",
    attachments: [],
  };
  walk(root, result, 0);
  return result;
}

function walk(part: Part, result: ParsedMail, depth: number) {
  const { type, params } = parseHeaderValue(part.headers.get("content-type") ?? "text/plain");
  const disposition = parseHeaderValue(part.headers.get("content-disposition") ?? "");
  if (type.startsWith("multipart/") && params.boundary && depth < MAX_DEPTH) {
    for (const child of splitMultipart(part.body, params.boundary)) walk(splitPart(child), result, depth + 1);
    return;
  }
  const content = decodeBody(part.body, part.headers.get("content-transfer-encoding") ?? "7bit");
  const filename = disposition.params.filename ?? params.name;
  const isAttachment = disposition.type === "attachment" || (filename !== undefined && type !== "text/plain");
  if (!isAttachment && type === "text/plain" && !result.text) {
    result.text = decodeCharset(content, params.charset);
    return;
  }
  if (isAttachment || !type.startsWith("text/")) {
    result.attachments.push({ filename: filename ?? `attachment-${result.attachments.length + 1}`, contentType: type, content });
  }
}

/** Headers and body of one entity; headers are unfolded and keyed in lower case (the first of a name wins). */
function splitPart(raw: Buffer): Part {
  let end = raw.indexOf("\r\n\r\n");
  let bodyStart = end + 4;
  const lfEnd = raw.indexOf("\n\n");
  if (end === -1 || (lfEnd !== -1 && lfEnd < end)) {
    end = lfEnd;
    bodyStart = lfEnd + 2;
  }
  if (end === -1) return { headers: new Map(), body: raw };
  const headerText = raw.subarray(0, end).toString("latin1").replace(/\r?\n[ \t]+/g, " ");
  const headers = new Map<string, string>();
  for (const line of headerText.split(/\r?\n/)) {
    const colon = line.indexOf(":");
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    if (!headers.has(name)) headers.set(name, line.slice(colon + 1).trim());
  }
  return { headers, body: raw.subarray(bodyStart) };
}

function splitMultipart(body: Buffer, boundary: string): Buffer[] {
  const delimiter = Buffer.from(`--${boundary}`);
  const parts: Buffer[] = [];
  let position = body.indexOf(delimiter);
  while (position !== -1) {
    const afterDelimiter = position + delimiter.length;
    if (body.subarray(afterDelimiter, afterDelimiter + 2).toString() === "--") break; // closing delimiter
    const lineEnd = body.indexOf("\n", afterDelimiter);
    if (lineEnd === -1) break;
    const next = body.indexOf(delimiter, lineEnd);
    if (next === -1) break;
    // the line break before the next delimiter belongs to the delimiter
    let partEnd = next;
    if (body[partEnd - 1] === 0x0a) partEnd -= 1;
    if (body[partEnd - 1] === 0x0d) partEnd -= 1;
    parts.push(body.subarray(lineEnd + 1, partEnd));
    position = next;
  }
  return parts;
}

function decodeBody(body: Buffer, encoding: string): Buffer {
  switch (encoding.trim().toLowerCase()) {
    case "base64":
      return Buffer.from(body.toString("latin1").replace(/[^A-Za-z0-9+/=]/g, ""), "base64");
    case "quoted-printable":
      return decodeQuotedPrintable(body.toString("latin1"));
    default:
      return body;
  }
}

function decodeQuotedPrintable(text: string): Buffer {
  const softBreaksRemoved = text.replace(/=\r?\n/g, "");
  const bytes: number[] = [];
  for (let i = 0; i < softBreaksRemoved.length; i++) {
    const char = softBreaksRemoved[i];
    const hex = softBreaksRemoved.slice(i + 1, i + 3);
    if (char === "=" && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      bytes.push(softBreaksRemoved.charCodeAt(i) & 0xff);
    }
  }
  return Buffer.from(bytes);
}

function decodeCharset(bytes: Buffer, charset = "utf-8"): string {
  try {
    return new TextDecoder(charset.toLowerCase()).decode(bytes);
  } catch {
    return bytes.toString("latin1");
  }
}

/** `type/subtype; key=value; key*=utf-8''%E2%82%AC; key*0=a; key*1=b` → type and decoded parameters. */
export function parseHeaderValue(value: string): { type: string; params: Record<string, string> } {
  const [first, ...rest] = splitOutsideQuotes(value, ";");
  const pieces = new Map<string, { text: string; encoded: boolean }[]>();
  const charsets = new Map<string, string>();
  for (const item of rest) {
    const equals = item.indexOf("=");
    if (equals <= 0) continue;
    const rawKey = item.slice(0, equals).trim().toLowerCase();
    let text = item.slice(equals + 1).trim();
    if (text.startsWith('"') && text.endsWith('"')) text = text.slice(1, -1).replace(/\\(.)/g, "$1");
    const match = /^([^*]+)(?:\*(\d+))?(\*)?$/.exec(rawKey);
    if (!match) continue;
    const [, key, index, star] = match;
    const encoded = star === "*";
    if (encoded && (index === undefined || index === "0")) {
      const quote = /^([^']*)'[^']*'(.*)$/.exec(text);
      if (quote) {
        charsets.set(key, quote[1] || "utf-8");
        text = quote[2];
      }
    }
    const list = pieces.get(key) ?? [];
    list[Number(index ?? 0)] = { text, encoded };
    pieces.set(key, list);
  }
  const params: Record<string, string> = {};
  for (const [key, list] of pieces) {
    const charset = charsets.get(key) ?? "utf-8";
    params[key] = list
      .filter(Boolean)
      .map((piece) => (piece.encoded ? decodeCharset(percentDecode(piece.text), charset) : decodeWords(piece.text)))
      .join("");
  }
  return { type: (first ?? "").trim().toLowerCase(), params };
}

function percentDecode(text: string): Buffer {
  const bytes: number[] = [];
  for (let i = 0; i < text.length; i++) {
    if (text[i] === "%" && /^[0-9A-Fa-f]{2}$/.test(text.slice(i + 1, i + 3))) {
      bytes.push(parseInt(text.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      bytes.push(...Buffer.from(text[i], "utf8"));
    }
  }
  return Buffer.from(bytes);
}

function splitOutsideQuotes(text: string, separator: string): string[] {
  const out: string[] = [];
  let current = "";
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const char = text[i];
    if (char === "\\" && quoted) {
      current += char + (text[i + 1] ?? "");
      i += 1;
      continue;
    }
    if (char === '"') quoted = !quoted;
    if (char === separator && !quoted) {
      out.push(current);
      current = "";
    } else {
      current += char;
    }
  }
  out.push(current);
  return out;
}

/** RFC 2047 encoded words (=?utf-8?B?…?= and =?utf-8?Q?…?=); whitespace between two encoded words is dropped. */
export function decodeWords(text: string): string {
  return text
    .replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?[^?]+\?[BbQq]\?[^?]*\?=)/g, "$1")
    .replace(/=\?([^?*]+)(?:\*[^?]*)?\?([BbQq])\?([^?]*)\?=/g, (_, charset: string, encoding: string, data: string) => {
      const bytes =
        encoding.toUpperCase() === "B" ? Buffer.from(data, "base64") : decodeQuotedPrintable(data.replace(/_/g, " "));
      return decodeCharset(bytes, charset);
    });
}
