// Accessibility check of the page as it stands, with axe-core. Only "serious" and "critical" findings count.
import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";

export interface A11yFinding {
  page: string;
  id: string;
  impact: string;
  help: string;
  targets: string[];
}

const counted = new Set(["serious", "critical"]);

export async function seriousA11yFindings(page: Page, label: string): Promise<A11yFinding[]> {
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations
    .filter((v) => v.impact && counted.has(v.impact))
    .map((v) => ({ page: label, id: v.id, impact: v.impact ?? "", help: v.help, targets: v.nodes.map((n) => n.target.join(" ")).slice(0, 10) }));
}

export function describeFindings(findings: A11yFinding[]): string {
  return findings.map((f) => `[${f.impact}] ${f.page}: ${f.id} — ${f.help}\n    ${f.targets.join("\n    ")}`).join("\n");
}
