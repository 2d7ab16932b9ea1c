// Every route the app serves, read from its routers, so a new route is covered by the security tests
// (and has to be named in their tables) without anyone remembering to add it.
import type { TestApp } from "../helpers/testApp";

export type Method = "get" | "post" | "put" | "patch" | "delete";
export interface RouteEntry {
  method: Method;
  /** The route as written, e.g. /api/users/:id */
  path: string;
}

interface Layer {
  rawPath?: string;
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

function walk(stack: Layer[], prefix: string, out: RouteEntry[]) {
  for (const layer of stack) {
    if (layer.route) {
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== "_all") out.push({ method: method as Method, path: prefix + layer.route.path });
      }
    } else if (layer.handle?.stack) {
      const mount = layer.rawPath && layer.rawPath !== "/" ? layer.rawPath : "";
      walk(layer.handle.stack, prefix + mount, out);
    }
  }
}

export function listRoutes(app: TestApp): RouteEntry[] {
  const out: RouteEntry[] = [];
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, "", out);
  return out;
}

export const STATE_CHANGING: readonly Method[] = ["post", "put", "patch", "delete"];

/** A route's path with its parameters filled in with harmless values. */
export function fillParams(route: string, values: Record<string, string> = {}): string {
  const defaults: Record<string, string> = { id: "1", index: "0", period: "2026-Q2" };
  return route.replace(/:(\w+)/g, (_, name: string) => values[name] ?? defaults[name] ?? "1");
}
