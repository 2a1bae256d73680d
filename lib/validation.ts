import type { z } from "zod";
import { AppError } from "./errors";

/** Turns a zod failure into per-field messages and one sentence for the whole request. */
export function zodToAppError(error: z.ZodError, what = "The request"): AppError {
  const fieldErrors: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    if (!(key in fieldErrors)) fieldErrors[key] = issueMessage(issue);
  }
  const first = error.issues[0];
  const where = first?.path.length ? ` (${first.path.join(".")})` : "";
  const message = first ? `${what} is not valid${where}: ${issueMessage(first)}` : `${what} is not valid.`;
  return new AppError("bad_request", message, { fieldErrors });
}

function issueMessage(issue: z.core.$ZodIssue): string {
  if (issue.code === "unrecognized_keys") return `Unknown field${issue.keys.length > 1 ? "s" : ""}: ${issue.keys.join(", ")}.`;
  return issue.message;
}

export function parseWith<S extends z.ZodType>(schema: S, value: unknown, what?: string): z.infer<S> {
  const result = schema.safeParse(value);
  if (!result.success) throw zodToAppError(result.error, what);
  return result.data;
}

/** Validates query parameters with a schema; a repeated parameter counts with its last value. */
export function parseSearchParams<S extends z.ZodType>(params: URLSearchParams, schema: S): z.infer<S> {
  const record: Record<string, string> = {};
  for (const [key, value] of params) record[key] = value;
  return parseWith(schema, record, "The query");
}

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: string): boolean {
  return uuidPattern.test(value);
}

/** Ids in URLs: a malformed id is treated exactly like a missing one (404). */
export function parseId(value: string | undefined, what: string): string {
  if (!value || !isUuid(value)) throw new AppError("not_found", `${what} was not found.`);
  return value.toLowerCase();
}
