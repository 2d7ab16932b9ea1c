// Download headers: a file name that survives every browser and file system, and cannot break the header.

/** `attachment; filename="…"` (or `inline`, shown in the page) with an ASCII fallback and the exact name as RFC 5987 UTF-8. */
export function contentDisposition(fileName: string, disposition: "attachment" | "inline" = "attachment"): string {
  const ascii = fileName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\/:*?<>|;]/g, "_").trim() || "download";
  const encoded = encodeURIComponent(fileName).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${disposition}; filename="${ascii}"; filename*=UTF-8''${encoded}`;
}
