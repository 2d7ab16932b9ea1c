// What a failed delivery is recorded as: the mail server's own answer where it gave one.
export function describeMailFailure(err: unknown): string {
  const error = err as { message?: string; code?: string; response?: string };
  const detail = error?.response ?? error?.message ?? String(err);
  return `${error?.code ? `${error.code}: ` : ""}${detail}`.slice(0, 500);
}
