/// <reference types="multer" />
/// <reference types="passport" />
/**
 * The adapter between Express and a service call: validates with the shared zod schemas,
 * hands the parsed values to the handler, and sends what it returns. Routes use it so that
 * `req`/`res` never leave the routes file.
 */
import type { NextFunction, Request, RequestHandler, Response } from "express";
import type { z } from "zod";
import { fieldMap, invalidFields, type FieldMap } from "../lib/app-error";
import { zodFields } from "../lib/zod-fields";

import type { Caller } from "../lib/caller";

export type { Caller } from "../lib/caller";

type Schemas = { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType };
type Out<S, K extends keyof S> = S[K] extends z.ZodType ? z.output<S[K]> : undefined;

export interface HandlerInput<S extends Schemas> {
  body: Out<S, "body">;
  query: Out<S, "query">;
  params: Out<S, "params">;
  caller: Caller | undefined;
  headers: Request["headers"];
  requestId: string;
  ip: string;
  file?: Express.Multer.File;
}

export interface Reply {
  status?: number;
  body?: unknown;
  headers?: Record<string, string>;
  /** Raw payload (CSV, iCalendar, GeoJSON) sent with `type` instead of JSON. */
  raw?: string | Buffer;
  type?: string;
}

function parsePart(schema: z.ZodType | undefined, value: unknown, part: string, fields: FieldMap) {
  if (!schema) return undefined;
  // No body at all reads as {} (so defaults apply); a JSON `null` never gets here (input-guard refuses it).
  const result = schema.safeParse(value === undefined && part === "body" ? {} : value);
  if (!result.success) {
    Object.assign(fields, zodFields(result.error, part === "body" ? undefined : part));
    return undefined;
  }
  return result.data;
}

export function handle<S extends Schemas>(
  schemas: S,
  handler: (input: HandlerInput<S>) => Promise<Reply | void> | Reply | void,
): RequestHandler {
  return async (req: Request, res: Response, next: NextFunction) => {
    try {
      const fields = fieldMap();
      const body = parsePart(schemas.body, req.body, "body", fields);
      const query = parsePart(schemas.query, req.query, "query", fields);
      const params = parsePart(schemas.params, req.params, "params", fields);
      if (Object.keys(fields).length > 0) throw invalidFields(fields);
      const reply = await handler({
        body,
        query,
        params,
        caller: req.user as Caller | undefined,
        headers: req.headers,
        requestId: String(req.id ?? ""),
        ip: req.ip ?? "",
        file: req.file,
      } as HandlerInput<S>);
      const r = reply ?? {};
      if (r.headers) res.set(r.headers);
      res.status(r.status ?? (r.body === undefined && r.raw === undefined ? 204 : 200));
      if (r.raw !== undefined) {
        if (r.type) res.type(r.type);
        res.send(r.raw);
      } else if (r.body === undefined) res.end();
      else res.json(r.body);
    } catch (err) {
      next(err);
    }
  };
}
