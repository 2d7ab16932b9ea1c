// The program's version, from package.json so that a release changes it in one place.
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const packageFile = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../package.json");

export const APP_VERSION: string = (JSON.parse(fs.readFileSync(packageFile, "utf8")) as { version: string }).version;
