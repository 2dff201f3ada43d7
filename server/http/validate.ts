import type { RequestHandler } from 'express';
import type { z } from 'zod';
import type { FieldProblem } from '../../shared/api-error';
import { AppError } from './app-error';

type Part = 'params' | 'query' | 'body';

/** One schema per request part; parts left out are not checked. */
export type RequestSchemas = Partial<Record<Part, z.ZodType>>;

/**
 * Checks every part at once and reports every problem together, then puts the
 * parsed, typed values back on the request so services can trust them.
 */
export function validate(schemas: RequestSchemas): RequestHandler {
  return (req, _res, next) => {
    const problems: FieldProblem[] = [];
    const parsed: Partial<Record<Part, unknown>> = {};
    for (const part of Object.keys(schemas) as Part[]) {
      // A body-less request arrives as undefined; treat it as an empty object so the schema reports missing fields.
      const input = part === 'body' ? (req.body ?? {}) : req[part];
      const result = schemas[part]!.safeParse(input);
      if (result.success) parsed[part] = result.data;
      else problems.push(...result.error.issues.map((issue) => toProblem(part, issue)));
    }
    if (problems.length > 0) {
      throw new AppError(422, 'validation_failed', describe(problems), problems);
    }
    if ('body' in parsed) req.body = parsed.body;
    // Express 5 exposes query and params through getters; shadow them on this request.
    if ('query' in parsed) Object.defineProperty(req, 'query', { value: parsed.query, enumerable: true, writable: true, configurable: true });
    if ('params' in parsed) Object.defineProperty(req, 'params', { value: parsed.params, enumerable: true, writable: true, configurable: true });
    next();
  };
}

function toProblem(part: Part, issue: z.core.$ZodIssue): FieldProblem {
  if (issue.code === 'unrecognized_keys') {
    const where = [part, ...issue.path.map(String)].join('.');
    return { field: where, message: `Unknown field${issue.keys.length > 1 ? 's' : ''}: ${issue.keys.join(', ')}.` };
  }
  return { field: [part, ...issue.path.map(String)].join('.'), message: issue.message };
}

function describe(problems: FieldProblem[]): string {
  const first = problems[0]!;
  const more = problems.length > 1 ? ` (and ${problems.length - 1} more problem${problems.length > 2 ? 's' : ''})` : '';
  return `Check ${first.field}: ${first.message}${more}`;
}
