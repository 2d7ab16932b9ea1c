// The real app on a seeded database, listening on a free port of 127.0.0.1.
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import { createApp } from "../../../server/app";
import { loadConfig } from "../../../server/config";
import type { Db } from "../../../server/db/client";

export interface RunningApp {
  baseUrl: string;
  close: () => Promise<void>;
}

export async function startApp(db: Db, clientDir: string): Promise<RunningApp> {
  const config = loadConfig({ NODE_ENV: "test", SESSION_SECRET: "e2e-session-secret-of-enough-length" });
  const app = createApp(db, config, { clientDir });
  const server: Server = await new Promise((resolve, reject) => {
    const listening = app.listen(0, "127.0.0.1", () => resolve(listening));
    listening.on("error", reject);
  });
  const { port } = server.address() as AddressInfo;
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
