// `npm run build` (after vite builds the client): compiles the server, the CLI and the import worker into
// plain JavaScript in dist/server, so production runs them with node alone (no tsx). Packages stay external
// and load from node_modules as usual (better-sqlite3 is native); drizzle/ and package.json are read from the
// project folder at run time (server/projectRoot.ts). `--outdir DIR` writes elsewhere (the build test).
import path from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const flag = process.argv.indexOf("--outdir");
const outdir = flag >= 0 ? path.resolve(process.argv[flag + 1]) : path.join(root, "dist/server");

await build({
  absWorkingDir: root,
  entryPoints: {
    main: "server/main.ts",
    cli: "cli/main.ts",
    // jobs.ts starts this file as its worker thread when it runs compiled
    importWorker: "server/imports/importWorker.ts",
    // offThread/pool.ts starts this file as its worker thread when it runs compiled
    answerWorker: "server/offThread/answerWorker.ts",
  },
  outdir,
  outExtension: { ".js": ".js" },
  bundle: true,
  platform: "node",
  format: "esm",
  target: "node20.19",
  packages: "external",
  sourcemap: true,
  logLevel: "warning",
});
console.log(`Compiled the server and CLI into ${path.relative(root, outdir) || outdir}.`);
