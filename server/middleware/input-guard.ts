/**
 * Checks every parsed JSON body and query string before any session, CSRF check or route sees
 * it: the body must be an object; no key at any depth (nor a query key, nor a bracketed part of
 * one) may be `__proto__`, `constructor` or `prototype`, the names that change or reach an
 * object's prototype; and nothing may nest deeper than {@link MAX_JSON_DEPTH} levels. The walk
 * keeps its own stack instead of recursing, so a body nested 50,000 deep cannot overflow it.
 */
import type { RequestHandler } from "express";
import { badRequest, fieldMap, invalidFields, type FieldMap } from "../lib/app-error";

/** Keys that name or reach an object's prototype. */
export const RESERVED_KEYS: ReadonlySet<string> = new Set(["__proto__", "constructor", "prototype"]);

/** Deepest nesting of arrays and objects a body may have; our deepest contract needs 3. */
export const MAX_JSON_DEPTH = 32;

/** Field names listed at most in one answer, so a body full of bad keys gets a short reply. */
const MAX_NAMED_FIELDS = 10;

const reservedMessage = "is a reserved name and cannot be a field; remove or rename this key";

/**
 * The problems of a parsed JSON value, by field path ("items.2.__proto__", like zod's names):
 * reserved keys at any depth, and nesting beyond `maxDepth` (named by its top-level field).
 */
export function jsonProblems(value: unknown, maxDepth = MAX_JSON_DEPTH): FieldMap {
  const fields = fieldMap();
  let named = 0;
  const stack: { value: unknown; path: string[] }[] = [{ value, path: [] }];
  while (stack.length > 0 && named < MAX_NAMED_FIELDS) {
    const { value: node, path } = stack.pop()!;
    if (node === null || typeof node !== "object") continue;
    if (path.length >= maxDepth) {
      const field = path[0]!;
      if (!(field in fields)) named += 1;
      fields[field] = `is nested more than ${maxDepth} levels deep`;
      continue;
    }
    if (Array.isArray(node)) {
      for (let i = node.length - 1; i >= 0; i -= 1) stack.push({ value: node[i], path: [...path, String(i)] });
      continue;
    }
    const keys = Object.keys(node);
    for (let i = keys.length - 1; i >= 0; i -= 1) {
      const key = keys[i]!;
      const childPath = [...path, key];
      if (RESERVED_KEYS.has(key)) {
        fields[childPath.join(".")] = reservedMessage;
        named += 1;
      } else {
        stack.push({ value: (node as Record<string, unknown>)[key], path: childPath });
      }
    }
  }
  return fields;
}

/** Query keys (`a[constructor]` too: bracket parsers read it as a nested key) that are reserved. */
export function queryProblems(query: Record<string, unknown>): FieldMap {
  const fields = fieldMap();
  for (const key of Object.keys(query)) {
    if (key.split(/[[\].]/).some((part) => RESERVED_KEYS.has(part))) fields[`query.${key}`] = reservedMessage;
  }
  return fields;
}

/** Mounted on /api right after the JSON body parser. */
export const inputGuard: RequestHandler = (req, _res, next) => {
  const body: unknown = req.body;
  if (body !== undefined && (body === null || typeof body !== "object" || Array.isArray(body))) {
    return next(
      badRequest(
        'The body must be an object in curly braces, such as {"name": "…"}; send {} when there is nothing to say.',
        fieldMap({ body: "must be an object" }),
      ),
    );
  }
  const fields = queryProblems(req.query as Record<string, unknown>);
  Object.assign(fields, jsonProblems(body));
  if (Object.keys(fields).length > 0) return next(invalidFields(fields));
  next();
};
