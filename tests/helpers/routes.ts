/**
 * Lists every route of an Express 5 app by walking its router stack (app.router, nested
 * routers and their mount paths), as "METHOD /path/:param" strings such as "PATCH /api/people/:id".
 * The access-table and fuzz tests use it so that no route can be added without them seeing it.
 */
import type { Express } from "express";

interface Layer {
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
  rawPath?: string | string[];
}

function walk(stack: Layer[], prefix: string, out: Set<string>) {
  for (const layer of stack) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      for (const method of Object.keys(layer.route.methods)) {
        if (method === "_all") continue;
        for (const path of paths) out.add(`${method.toUpperCase()} ${prefix}${path}`);
      }
    } else if (layer.handle?.stack) {
      const mount = typeof layer.rawPath === "string" && layer.rawPath !== "/" ? layer.rawPath : "";
      walk(layer.handle.stack, prefix + mount, out);
    }
  }
}

/** Every "METHOD /path" the app answers, sorted. */
export function listRoutes(app: Express): string[] {
  const router = (app as unknown as { router: { stack: Layer[] } }).router;
  const out = new Set<string>();
  walk(router.stack, "", out);
  return [...out].sort();
}

/** Only the API routes (under /api). */
export function listApiRoutes(app: Express): string[] {
  return listRoutes(app).filter((r) => r.split(" ")[1]!.startsWith("/api/"));
}

/** Splits "PATCH /api/people/:id" into its method and path. */
export function parseRoute(route: string): { method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE"; path: string } {
  const [method, path] = route.split(" ") as ["GET" | "POST" | "PUT" | "PATCH" | "DELETE", string];
  return { method, path };
}
