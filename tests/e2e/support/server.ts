// The real app on a seeded database, listening on a free port of 127.0.0.1, sending its mail to the local mail
// service (messages land in the database's mailbox, as the Outbox shows them).
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import { createApp } from "../../../server/app";
import { loadConfig } from "../../../server/config";
import type { Db } from "../../../server/db/client";
import { startLocalMailService } from "../../../server/mail/localService";

export interface RunningApp {
  baseUrl: string;
  close: () => Promise<void>;
}

export async function startApp(db: Db, clientDir: string): Promise<RunningApp> {
  const mail = await startLocalMailService(db, { port: 0 });
  const config = loadConfig({ NODE_ENV: "test", SESSION_SECRET: "e2e-session-secret-of-enough-length", SMTP_URL: mail.url });
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
        server.close(() => void mail.close().then(resolve, resolve));
      }),
  };
}
