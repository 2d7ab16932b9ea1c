/**
 * The page to return to after signing in, from ?next=. Only paths inside Quarterbeat are accepted, so a
 * crafted link cannot bounce a user to another site ("//evil.example", "https://…", "/\\evil").
 */
export function safeNextPath(next: string | null): string | null {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.startsWith("/\\")) return null;
  if (next.startsWith("/sign-in")) return null;
  return next;
}
