// `npm run dev`: the API server (restarted on change by tsx watch) and Vite's hot-reloading client in front
// of it. Open the URL Vite prints; /api is forwarded to the API server.
import { spawn, type ChildProcess } from "node:child_process";

const apiPort = process.env.PORT ?? "3000";
const children: ChildProcess[] = [
  spawn("npx", ["tsx", "watch", "--clear-screen=false", "server/main.ts"], { stdio: "inherit", env: { ...process.env, PORT: apiPort } }),
  spawn("npx", ["vite", "--port", process.env.VITE_PORT ?? "5173", "--strictPort"], {
    stdio: "inherit",
    env: { ...process.env, QUARTERBEAT_API: `http://localhost:${apiPort}` },
  }),
];

function stop() {
  for (const child of children) child.kill("SIGTERM");
  process.exit(0);
}
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
for (const child of children) child.on("exit", (code) => code && stop());
