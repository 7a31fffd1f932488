import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { HttpError, type ErrorIssue } from '../lib/http-error';

interface Schemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

export function issuesFrom(error: z.ZodError, prefix: string): ErrorIssue[] {
  return error.issues.map((issue) => ({
    path: [prefix, ...issue.path.map(String)].join('.'),
    message: issue.message,
  }));
}

/**
 * Parses the request parts with the shared zod schemas and stores the parsed values in
 * `res.locals.valid`, so handlers never touch the raw input.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const valid: Record<string, unknown> = {};
    const issues: ErrorIssue[] = [];
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(req[part] ?? {});
      if (result.success) valid[part] = result.data;
      else issues.push(...issuesFrom(result.error, part));
    }
    if (issues.length > 0) {
      next(new HttpError(400, 'invalid_request', 'Some fields need attention.', issues));
      return;
    }
    res.locals.valid = valid;
    next();
  };
}

/** Typed access to what `validate` parsed. */
export function parsed<T extends z.ZodType>(
  res: { locals: Record<string, unknown> },
  part: keyof Schemas,
  _schema: T,
): z.infer<T> {
  return (res.locals.valid as Record<string, unknown>)[part] as z.infer<T>;
}
