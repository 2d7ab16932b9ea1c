// The demo sign-ins, read from the demo directory rather than written out here.
import type { UserRole } from "../../../shared/domain";
import { buildDirectory, type DemoAccount } from "../../../server/demo/directory";
import { DEMO_SCENARIO } from "../../../server/demo/scenario";

export const demoDirectory = buildDirectory(DEMO_SCENARIO);

export function demoAccount(role: UserRole): DemoAccount {
  const account = demoDirectory.accounts.find((a) => a.role === role);
  if (!account) throw new Error(`The demo directory has no ${role} account`);
  return account;
}
