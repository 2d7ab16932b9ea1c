// `npm run lint`: the recommended JavaScript, TypeScript and React hooks rules, plus the project's own
// architecture as rules: which folder may import which, and where the environment may be read.
// Rules run without type information so the whole tree lints in seconds; `tsc` does the type checks.
import js from "@eslint/js";
import eslintConfigPrettier from "eslint-config-prettier/flat";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

/** A relative import that climbs out of its folder and into the named top-level folder. */
const intoFolder = (name) => `^(\\.\\./)+${name}(/|$)`;

/** Forbids imports of the named top-level folders, static or dynamic, from the files the block applies to. */
function importsNothingFrom(folders, why) {
  const message = (name) => `${why} (no imports from ${name}/).`;
  return {
    "no-restricted-imports": ["error", { patterns: folders.map((name) => ({ regex: intoFolder(name), message: message(name) })) }],
    "no-restricted-syntax": [
      "error",
      ...folders.map((name) => ({ selector: `ImportExpression[source.value=/${intoFolder(name).replaceAll("/", "\\/")}/]`, message: message(name) })),
    ],
  };
}

export default tseslint.config(
  { ignores: ["node_modules/", "dist/", "data/", "drizzle/", "test-results/", ".bench/", "coverage/"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { ecmaVersion: 2023, sourceType: "module", globals: { ...globals.node } },
    linterOptions: { reportUnusedDisableDirectives: "error" },
    rules: {
      // Names starting with "_" are left out of a destructuring on purpose (e.g. a row without its PDF bytes).
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", destructuredArrayIgnorePattern: "^_", ignoreRestSiblings: true },
      ],
      eqeqeq: ["error", "always", { null: "ignore" }],
      "no-console": "off",
    },
  },
  {
    files: ["src/**/*.{ts,tsx}", "tests/components/**/*.{ts,tsx}"],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { "react-hooks": reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },

  // The architecture (DEVELOPERS.md): shared/ is isomorphic and stands alone; the client reaches the server
  // only over HTTP; the CLI calls the server's services, never the client.
  { files: ["shared/**/*.ts"], rules: importsNothingFrom(["src", "server", "cli", "bench"], "shared/ is isomorphic and stands alone") },
  { files: ["src/**/*.{ts,tsx}"], rules: importsNothingFrom(["server", "cli", "bench"], "The client talks to the server only over HTTP") },
  { files: ["server/**/*.ts"], rules: importsNothingFrom(["src", "cli", "bench"], "The server serves the client and the CLI but never imports them") },
  { files: ["cli/**/*.ts"], rules: importsNothingFrom(["src", "bench"], "The CLI calls the server's services, not the client") },

  // server/config.ts is the one reader of the environment; everything else receives a Config.
  {
    files: ["server/**/*.ts", "cli/**/*.ts", "shared/**/*.ts", "src/**/*.{ts,tsx}"],
    ignores: ["server/config.ts"],
    rules: {
      "no-restricted-properties": ["error", { object: "process", property: "env", message: "Read settings through server/config.ts." }],
    },
  },

  // layout is Prettier's (`npm run format`); no lint rule may disagree with it
  eslintConfigPrettier,
);
