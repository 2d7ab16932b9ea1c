// Addresses of a manikin's own page, carrying the period and filters the user was looking at.

/** `search` is a query string without "?" (e.g. from linkParams); empty for none. */
export function manikinPath(assetId: string, search = ""): string {
  return `/equipment/manikins/${encodeURIComponent(assetId)}${search ? `?${search}` : ""}`;
}
