import type { Request } from 'express';
import type { z } from 'zod';
import { AppError } from './errors';

function fieldsOf(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

function parse<S extends z.ZodType>(schema: S, value: unknown, where: string): z.infer<S> {
  const res = schema.safeParse(value);
  if (res.success) return res.data;
  const fields = fieldsOf(res.error);
  const first = res.error.issues[0];
  const at = first.path.length ? `${first.path.join('.')}: ` : '';
  throw new AppError(400, 'invalid_input', `Check the ${where}: ${at}${first.message}`, fields);
}

/** Parses `req.body` with a zod schema, or answers 400 with per-field messages. */
export const body = <S extends z.ZodType>(req: Request, schema: S): z.infer<S> => parse(schema, req.body ?? {}, 'form');
export const params = <S extends z.ZodType>(req: Request, schema: S): z.infer<S> => parse(schema, req.params, 'address');
export const query = <S extends z.ZodType>(req: Request, schema: S): z.infer<S> => parse(schema, req.query, 'query');
