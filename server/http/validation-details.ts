import type { ErrorDetail } from '../errors.ts';

/** One issue as the zod type provider hands it over: its path, message and zod's own fields. */
interface ValidationIssue {
  instancePath: string;
  message?: string;
  params?: { errors?: Array<Array<{ path: PropertyKey[]; message: string }>> };
}

/**
 * Each issue as `{path, message}` under `where` (body, params, querystring). A body that may take two
 * shapes (a JSON roster or a CSV text) fails as a whole with zod's "Invalid input"; it is explained by
 * the shape the body came closest to, the one whose complaints reach deepest into it.
 */
export function validationDetails(where: string, issues: ValidationIssue[]): ErrorDetail[] {
  return issues.flatMap((issue) => {
    const base = issue.instancePath.split('/').filter(Boolean);
    const branches = issue.params?.errors;
    const closest = branches?.length ? branches.reduce((best, b) => (depth(b) > depth(best) ? b : best)) : undefined;
    const parts = closest ? closest.map((i) => ({ path: [...base, ...i.path.map(String)], message: i.message })) : [{ path: base, message: issue.message ?? 'invalid' }];
    return parts.map((p) => ({ path: [where, ...p.path].join('.'), message: p.message }));
  });
}

const depth = (issues: Array<{ path: PropertyKey[] }>) => Math.max(0, ...issues.map((i) => i.path.length));
