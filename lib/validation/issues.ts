import type { ZodError } from "zod";

/*
 * The one way zod issues become messages for a form or an API answer: every message keyed
 * by the dotted path of its field ("readings.3.diameterMm"), and the first one as a
 * sentence. Issues about the whole input (no path) go under "". No server imports: forms
 * in the browser use it as the server does.
 */

export type FieldMessages = Record<string, string[]>;

/** Every issue's message, keyed by the dotted path of its field ("" for the whole input). */
export function fieldMessages(error: ZodError): FieldMessages {
  const out: FieldMessages = {};
  for (const issue of error.issues) (out[issue.path.map(String).join(".")] ??= []).push(issue.message);
  return out;
}

/**
 * The first issue as one sentence naming the field, plus every field's messages: what a
 * refused API request answers and what a form shows at the top.
 */
export function describeIssues(error: ZodError): { message: string; field: string; fields: FieldMessages } {
  const first = error.issues[0];
  const field = first ? first.path.map(String).join(".") : "";
  return { message: first ? (field ? `${first.message} (field: ${field})` : first.message) : "The request is not valid.", field, fields: fieldMessages(error) };
}
