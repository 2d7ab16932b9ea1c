// Where an attempt page's back link leads: the list the user came from, with its filters, carried in the
// attempt's link as ?from=/attempts?quarter=… so it survives a reload or a new tab. Only a path inside the
// app is ever followed; anything else (another site, "//host", "javascript:") falls back to the default.

const ORIGIN = "https://quarterbeat.invalid";

/** The path itself when it is an in-app path ("/attempts?…", "/classes/C-1"); otherwise null. */
export function inAppPath(value: string | null | undefined): string | null {
  if (!value || value.length > 2000 || !value.startsWith("/") || value.startsWith("//") || hasBackslashOrControl(value)) return null;
  let url: URL;
  try {
    url = new URL(value, ORIGIN);
  } catch {
    return null;
  }
  if (url.origin !== ORIGIN) return null;
  return `${url.pathname}${url.search}${url.hash}`;
}

/** The link to an attempt that remembers the page it was opened from. */
export function attemptHref(id: string, from: string): string {
  return `/attempts/${encodeURIComponent(id)}?${new URLSearchParams({ from }).toString()}`;
}

/** What the back link says for the page it returns to. */
export function backLabel(path: string): string {
  const classMatch = /^\/classes\/([^/?#]+)/.exec(path);
  if (classMatch) return `Back to class ${safeDecode(classMatch[1])}`;
  if (path.startsWith("/my-standing")) return "Back to My standing";
  if (path.startsWith("/errors")) return "Back to Error trends";
  return "Back to attempts";
}

function safeDecode(text: string): string {
  try {
    return decodeURIComponent(text);
  } catch {
    return text;
  }
}

/** A backslash or a control character (U+0000–U+001F): browsers read either in ways a plain path never needs. */
function hasBackslashOrControl(value: string): boolean {
  for (let i = 0; i < value.length; i++) {
    const code = value.charCodeAt(i);
    if (code < 0x20 || code === 0x5c) return true;
  }
  return false;
}
