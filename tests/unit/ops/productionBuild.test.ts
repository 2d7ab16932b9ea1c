// The production build as an operator runs it: `npm start` with NODE_ENV=production in a copy of the project
// whose node_modules lacks the development tools (tsx, vite, esbuild, typescript, vitest, drizzle-kit). It
// must refuse in one line while nothing is built, then run the compiled server, CLI and import worker.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../..");
const developmentTools = new Set(["tsx", "vite", "esbuild", "typescript", "vitest", "drizzle-kit", ".bin"]);
const BUILD_TIMEOUT = 240_000;

let copy: string;
let server: ChildProcess | null = null;

/** A project folder as deployed: package.json, drizzle/, the start script and every runtime package. */
function makeDeployedCopy(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "quarterbeat-deploy-"));
  fs.copyFileSync(path.join(root, "package.json"), path.join(dir, "package.json"));
  fs.cpSync(path.join(root, "drizzle"), path.join(dir, "drizzle"), { recursive: true });
  fs.mkdirSync(path.join(dir, "scripts"));
  fs.copyFileSync(path.join(root, "scripts/start.mjs"), path.join(dir, "scripts/start.mjs"));
  fs.mkdirSync(path.join(dir, "node_modules"));
  for (const name of fs.readdirSync(path.join(root, "node_modules"))) {
    if (!developmentTools.has(name)) fs.symlinkSync(path.join(root, "node_modules", name), path.join(dir, "node_modules", name));
  }
  return dir;
}

function startProduction(env: Record<string, string> = {}) {
  return spawn(process.execPath, [path.join(copy, "scripts/start.mjs")], {
    cwd: copy,
    env: {
      PATH: process.env.PATH ?? "",
      NODE_ENV: "production",
      PORT: "0",
      BACKUP_DIR: "off",
      LOG_LEVEL: "warn",
      QUARTERBEAT_DB: path.join(copy, "data/quarterbeat.sqlite"),
      ...env,
    },
  });
}

/** Resolves with the address the server prints once it listens; rejects with its output if it exits first. */
function listeningUrl(child: ChildProcess): Promise<string> {
  return new Promise((resolve, reject) => {
    let output = "";
    const read = (chunk: Buffer) => {
      output += chunk.toString();
      const match = /running at (http:\/\/localhost:\d+)/.exec(output);
      if (match) resolve(match[1]);
    };
    child.stdout?.on("data", read);
    child.stderr?.on("data", read);
    child.on("exit", (code) => reject(new Error(`the server exited with ${code}:\n${output}`)));
  });
}

beforeAll(() => {
  copy = makeDeployedCopy();
});

afterAll(() => {
  server?.kill("SIGTERM");
  if (copy) fs.rmSync(copy, { recursive: true, force: true });
});

describe("production build", () => {
  it("refuses to start in one line while the build is missing", () => {
    const result = spawnSync(process.execPath, [path.join(copy, "scripts/start.mjs")], {
      cwd: copy,
      encoding: "utf8",
      env: { PATH: process.env.PATH ?? "", NODE_ENV: "production" },
    });
    expect(result.status).toBe(1);
    expect(result.stderr.trim().split("\n")).toEqual([
      "quarterbeat: the production build is missing (dist/server/main.js, dist/client/index.html): run `npm run build` first.",
    ]);
  });

  it(
    "runs the compiled server, CLI, import worker and answer worker with node alone",
    async () => {
      const vite = spawnSync(
        process.execPath,
        [path.join(root, "node_modules/vite/bin/vite.js"), "build", "--outDir", path.join(copy, "dist/client"), "--emptyOutDir", "--logLevel", "warn"],
        { cwd: root, encoding: "utf8" },
      );
      expect(vite.status, vite.stderr).toBe(0);
      const compile = spawnSync(process.execPath, [path.join(root, "scripts/build-server.mjs"), "--outdir", path.join(copy, "dist/server")], {
        cwd: root,
        encoding: "utf8",
      });
      expect(compile.status, compile.stderr).toBe(0);

      // the CLI: a first coordinator for an empty production database
      const cli = (args: string[], input?: string) =>
        spawnSync(process.execPath, [path.join(copy, "dist/server/cli.js"), "--db", path.join(copy, "data/quarterbeat.sqlite"), ...args], {
          cwd: copy,
          input,
          encoding: "utf8",
          env: { PATH: process.env.PATH ?? "" },
        });
      const added = cli(
        ["users", "add", "first.coordinator@network.example", "--name", "First Coordinator", "--role", "coordinator", "--password-stdin"],
        "a-long-enough-password-2026\n",
      );
      expect(added.status, added.stderr).toBe(0);
      const listed = cli(["users", "list", "--json"]);
      expect(JSON.parse(listed.stdout).map((user: { email: string }) => user.email)).toEqual(["first.coordinator@network.example"]);

      server = startProduction();
      const url = await listeningUrl(server);
      const health = await fetch(`${url}/api/health`);
      expect(health.status).toBe(200);
      const body = (await health.json()) as { ok: boolean; version: string; database: { ok: boolean; migration: { current: boolean } } };
      expect(body.ok).toBe(true);
      expect(body.version).toBe(JSON.parse(fs.readFileSync(path.join(root, "package.json"), "utf8")).version);
      expect(body.database.migration.current).toBe(true);
      // the client shell comes from the build, not from a development server
      const shell = await (await fetch(`${url}/overview`)).text();
      expect(shell).toContain('<div id="root">');
      expect(shell).not.toContain("/@vite/client");
      // production never seeds the demo network
      expect(cli(["users", "list", "--json"]).stdout).not.toContain("harrowmere");

      // the compiled import worker, as jobs.ts starts it, checks a class log
      const worker = new Worker(path.join(copy, "dist/server/importWorker.js"));
      const done = new Promise<{ type: string; summary?: { rowsRead: number }; message?: string }>((resolve) =>
        worker.on("message", (m) => m.type !== "progress" && resolve(m)),
      );
      worker.postMessage({
        jobId: "build-check",
        dbFile: path.join(copy, "data/quarterbeat.sqlite"),
        options: { kind: "classes", input: { path: path.join(root, "tests/fixtures/import/classes-valid.csv") }, dryRun: true, source: "cli" },
      });
      const answer = await done;
      await worker.terminate();
      expect(answer.message).toBeUndefined();
      expect(answer.type).toBe("done");
      expect(answer.summary?.rowsRead).toBeGreaterThan(0);

      // the compiled answer worker, as offThread/pool.ts starts it, computes an overview of the empty network
      const answerWorker = new Worker(path.join(copy, "dist/server/answerWorker.js"));
      const answered = new Promise<{ id: number; json?: string; crash?: string; error?: unknown }>((resolve) => answerWorker.on("message", resolve));
      const viewer = {
        user: { id: 1, email: "c@network.example", displayName: "C", role: "coordinator", instructorId: null },
        seesEveryone: true,
        ownInstructorId: null,
        suppressionMinCount: 5,
        suppressionMinInstructors: 3,
      };
      const filters = {
        period: { from: "2026-Q3", to: "2026-Q3", quarters: ["2026-Q3"] },
        siteId: null,
        profile: null,
        feedback: null,
        instructorId: null,
        manikinId: null,
      };
      answerWorker.postMessage({
        id: 1,
        dbFile: path.join(copy, "data/quarterbeat.sqlite"),
        key: "build-check",
        useCache: false,
        name: "overview",
        args: [viewer, filters, { limits: "binomial", splitAt: null }],
      });
      const reply = await answered;
      await answerWorker.terminate();
      expect(reply.crash).toBeUndefined();
      expect(JSON.parse(reply.json!)).toMatchObject({ attempts: 0, period: { from: "2026-Q3" } });
    },
    BUILD_TIMEOUT,
  );
});
