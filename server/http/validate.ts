import type { Request } from 'express';
import type * as z from 'zod';
import { NUL_MESSAGE, hasNul } from '../../shared/schemas/common';
import { AppError } from './errors';

function fieldsOf(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/**
 * The path (`name`, `columns.0.note`) of the first string or key holding U+0000, if any.
 * PostgreSQL refuses that character in text and jsonb, so it would otherwise fail the query.
 * Walked without recursion: a 1 MB body can nest arrays deeper than the call stack goes.
 */
export function nulPath(value: unknown): string | undefined {
  // Each entry knows its parent, so the path is only built for the one string that fails.
  interface At {
    v: unknown;
    key: string | null;
    parent: At | null;
  }
  const pathOf = (at: At | null, last?: string): string => {
    const keys: string[] = last === undefined ? [] : [last];
    for (let a = at; a && a.key !== null; a = a.parent) keys.push(a.key);
    return keys.reverse().join('.') || '_';
  };
  const stack: At[] = [{ v: value, key: null, parent: null }];
  while (stack.length) {
    const at = stack.pop()!;
    const v = at.v;
    if (typeof v === 'string') {
      if (hasNul(v)) return pathOf(at);
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], key: String(i), parent: at });
    } else if (v && typeof v === 'object') {
      const entries = Object.entries(v);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [k, child] = entries[i];
        if (hasNul(k)) return pathOf(at, k.replaceAll('\u0000', ''));
        stack.push({ v: child, key: k, parent: at });
      }
    }
  }
  return undefined;
}

function parse<S extends z.ZodType>(schema: S, value: unknown, where: string): z.infer<S> {
  const nul = nulPath(value);
  if (nul !== undefined) {
    throw new AppError(400, 'invalid_input', `Check the ${where}: ${nul} ${NUL_MESSAGE}`, { [nul]: `This ${NUL_MESSAGE}` });
  }
  const res = schema.safeParse(value);
  if (res.success) return res.data;
  const fields = fieldsOf(res.error);
  const first = res.error.issues[0];
  const at = first.path.length ? `${first.path.join('.')}: ` : '';
  throw new AppError(400, 'invalid_input', `Check the ${where}: ${at}${first.message}`, fields);
}

/**
 * Parses a part of a request that a route checks on its own (one action of a batch), with the
 * same 400 and messages as `body()` gives for a whole request body.
 */
export const checked = <S extends z.ZodType>(schema: S, value: unknown): z.infer<S> => parse(schema, value, 'form');

/** Where a validator reads its input from. */
export type Slot = 'body' | 'params' | 'query';
/** Told which schema object a validator used on which route (`GET /api/fields/:id`). */
export type ValidatorRecorder = (route: string, slot: Slot, schema: z.ZodType) => void;

let recorder: ValidatorRecorder | null = null;

/**
 * Tests turn this on to check that the OpenAPI contract names the very schemas the handlers use
 * (tests/api/openapi.test.ts). Off, it costs one null check per validation.
 */
export function recordValidators(r: ValidatorRecorder | null): void {
  recorder = r;
}

function note(req: Request, slot: Slot, schema: z.ZodType): void {
  // req.route is the matched route; baseUrl is where its router is mounted (/api/fields).
  const route = req.route as { path?: unknown } | undefined;
  recorder?.(`${req.method} ${req.baseUrl}${typeof route?.path === 'string' ? route.path : '(no route)'}`, slot, schema);
}

/** Parses `req.body` with a zod schema, or answers 400 with per-field messages. */
export const body = <S extends z.ZodType>(req: Request, schema: S): z.infer<S> => {
  if (recorder) note(req, 'body', schema);
  return parse(schema, req.body ?? {}, 'form');
};
export const params = <S extends z.ZodType>(req: Request, schema: S): z.infer<S> => {
  if (recorder) note(req, 'params', schema);
  return parse(schema, req.params, 'address');
};
export const query = <S extends z.ZodType>(req: Request, schema: S): z.infer<S> => {
  if (recorder) note(req, 'query', schema);
  return parse(schema, req.query, 'query');
};
