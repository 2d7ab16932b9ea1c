// The import rules between the top-level folders and the one reader of the environment, as `npm run lint`
// applies them (eslint.config.js), checked on small sources placed in each folder.
import { ESLint } from "eslint";
import { describe, expect, it } from "vitest";

const eslint = new ESLint({ cwd: process.cwd() });

async function rulesBroken(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.map((m) => m.ruleId ?? m.message);
}

describe("lint boundaries", () => {
  it("keeps shared/ free of imports from the other folders", async () => {
    for (const target of ["src/app/AppLayout", "server/config", "cli/errors"]) {
      expect(await rulesBroken("shared/schemas/example.ts", `import { a } from "../../${target}";\nexport const b = a;\n`)).toContain("no-restricted-imports");
    }
    expect(await rulesBroken("shared/example.ts", `import { a } from "./units";\nexport const b = a;\n`)).toEqual([]);
  });

  it("keeps the client away from server and CLI code", async () => {
    expect(await rulesBroken("src/features/example.ts", `import { a } from "../../server/errors";\nexport const b = a;\n`)).toContain("no-restricted-imports");
    expect(await rulesBroken("src/features/example.ts", `import { a } from "../../cli/errors";\nexport const b = a;\n`)).toContain("no-restricted-imports");
    expect(await rulesBroken("src/features/example.ts", `import { a } from "../../shared/units";\nexport const b = a;\n`)).toEqual([]);
    expect(await rulesBroken("src/features/example.ts", `export const load = () => import("../../server/errors");\n`)).toContain("no-restricted-syntax");
    expect(await rulesBroken("src/features/example.ts", `export const load = () => import("../../shared/units");\n`)).toEqual([]);
  });

  it("lets the CLI call server services but not client code", async () => {
    expect(await rulesBroken("cli/commands/example.ts", `import { a } from "../../server/users/service";\nexport const b = a;\n`)).toEqual([]);
    expect(await rulesBroken("cli/commands/example.ts", `import { a } from "../../src/api/http";\nexport const b = a;\n`)).toContain("no-restricted-imports");
    expect(await rulesBroken("server/users/example.ts", `import { a } from "../../cli/errors";\nexport const b = a;\n`)).toContain("no-restricted-imports");
  });

  it("reads the environment only in server/config.ts", async () => {
    const code = "export const port = process.env.PORT;\n";
    expect(await rulesBroken("server/http/example.ts", code)).toContain("no-restricted-properties");
    expect(await rulesBroken("cli/example.ts", code)).toContain("no-restricted-properties");
    expect(await rulesBroken("server/config.ts", code)).toEqual([]);
  });
});
