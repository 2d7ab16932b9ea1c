// The "extra addresses" box of the send form: addresses separated by commas, semicolons, spaces or line
// breaks, each checked with the same schema the server applies (shared/schemas/report.ts).
import { emailSchema } from "../../../shared/schemas/auth";
import { sendReportSchema } from "../../../shared/schemas/report";

export type ExtraAddresses = { ok: true; addresses: string[] } | { ok: false; message: string };

export function parseExtraAddresses(text: string): ExtraAddresses {
  const parts = text
    .split(/[\s,;]+/)
    .map((part) => part.trim())
    .filter(Boolean);
  const bad = parts.filter((part) => !emailSchema.safeParse(part).success);
  if (bad.length > 0) {
    const list = bad.map((b) => `“${b}”`).join(", ");
    return { ok: false, message: `${list} ${bad.length === 1 ? "is not an e-mail address" : "are not e-mail addresses"}. Use the form name@example.org.` };
  }
  const addresses = [...new Set(parts.map((part) => emailSchema.parse(part)))];
  const checked = sendReportSchema.shape.extraRecipients.safeParse(addresses);
  if (!checked.success) return { ok: false, message: checked.error.issues[0]?.message ?? "Check the addresses." };
  return { ok: true, addresses: checked.data };
}
