/**
 * `validate({ body, query, params })`: parses each part once with zod and passes the parsed
 * values on in `res.locals.input`, so handlers never re-parse. A failure answers 400 naming
 * every bad field (`body.email`, `params.studioId`).
 */
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import { BadRequestError } from './errors.js';

export interface Schemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

export type Parsed<S extends Schemas> = {
  [K in keyof S]: S[K] extends z.ZodType ? z.output<S[K]> : never;
};

export function fieldsOf(part: string, error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = [part, ...issue.path.map(String)].join('.');
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

export function validate<S extends Schemas>(schemas: S): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    const out: Record<string, unknown> = {};
    let fields: Record<string, string> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const raw = part === 'body' ? (req.body ?? {}) : req[part];
      const r = schema.safeParse(raw);
      if (r.success) out[part] = r.data;
      else fields = { ...fields, ...fieldsOf(part, r.error) };
    }
    if (Object.keys(fields).length > 0) {
      const first = Object.entries(fields)[0];
      throw new BadRequestError(`Check ${first[0]}: ${first[1]}`, fields);
    }
    res.locals.input = out;
    next();
  };
}

/** The values `validate` parsed for this request. */
export function input<S extends Schemas>(res: Response, _schemas?: S): Parsed<S> {
  return res.locals.input as Parsed<S>;
}
