// `npm start`. In production (NODE_ENV=production) it runs the compiled server from `npm run build` with node
// alone, and stops with one line when that build is missing; otherwise it runs the TypeScript source through
// tsx (development and the demo), which builds the client on first start.
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

if (process.env.NODE_ENV === "production") {
  const missing = ["dist/server/main.js", "dist/client/index.html"].filter((file) => !fs.existsSync(path.join(root, file)));
  if (missing.length > 0) {
    console.error(`quarterbeat: the production build is missing (${missing.join(", ")}): run \`npm run build\` first.`);
    process.exit(1);
  }
  await import(pathToFileURL(path.join(root, "dist/server/main.js")).href);
} else {
  const { register } = await import("tsx/esm/api");
  register();
  await import(pathToFileURL(path.join(root, "server/main.ts")).href);
}
