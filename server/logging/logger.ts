// The server's one logger: JSON lines on standard output (one per request and per import or report send),
// at the level the configuration names.
import { createRequire } from "node:module";
import { pino, type DestinationStream, type Logger, type LoggerOptions } from "pino";
import type { Config } from "../config";

export type { Logger };

/** pino-pretty is not a dependency: pretty lines only where a developer has it installed already. */
function prettyAvailable(): boolean {
  try {
    createRequire(import.meta.url).resolve("pino-pretty");
    return true;
  } catch {
    return false;
  }
}

export function createLogger(config: Pick<Config, "logLevel" | "nodeEnv">, destination?: DestinationStream): Logger {
  const options: LoggerOptions = {
    level: config.logLevel,
    base: { service: "quarterbeat" },
    timestamp: pino.stdTimeFunctions.isoTime,
  };
  if (destination) return pino(options, destination);
  if (config.nodeEnv === "development" && process.stdout.isTTY && prettyAvailable()) {
    return pino({ ...options, transport: { target: "pino-pretty" } });
  }
  return pino(options);
}
