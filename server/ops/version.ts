// The program's version, from package.json so that a release changes it in one place.
import fs from "node:fs";
import path from "node:path";
import { projectRoot } from "../projectRoot";

const packageFile = path.join(projectRoot, "package.json");

export const APP_VERSION: string = (JSON.parse(fs.readFileSync(packageFile, "utf8")) as { version: string }).version;
