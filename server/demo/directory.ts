// The network's directory as the seed step needs it: network name, sites, instructors and one sign-in
// account per role.
import type { UserRole } from "../../shared/domain";
import type { DemoScenario } from "./scenario";

export interface DemoSite {
  code: string;
  name: string;
}

export interface DemoInstructor {
  code: string;
  name: string;
  site: string;
}

export interface DemoAccount {
  role: UserRole;
  email: string;
  displayName: string;
  /** Shared demo password: for the demo network only, never for real data. */
  password: string;
  /** Instructor code the account is linked to (instructor role only). */
  instructor: string | null;
}

export interface DemoDirectory {
  network: { name: string; region: string };
  sites: DemoSite[];
  instructors: DemoInstructor[];
  accounts: DemoAccount[];
}

export function buildDirectory(scenario: DemoScenario): DemoDirectory {
  return {
    network: { ...scenario.network },
    sites: scenario.sites.map(({ code, name }) => ({ code, name })),
    instructors: scenario.instructors.map(({ code, name, site }) => ({ code, name, site })),
    accounts: scenario.accounts.map((account) => ({
      role: account.role,
      email: `${account.mailbox}@${scenario.emailDomain}`,
      displayName: account.displayName,
      password: scenario.demoPassword,
      instructor: account.instructor,
    })),
  };
}
