import type { H3Event } from 'h3'
import type { z } from 'zod'

/** Parses with a zod schema; a failure is a 400 whose statusMessage is the first problem in plain words, every problem in data.issues. */
export function parseOr400<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input)
  if (result.success) return result.data
  const issues = result.error.issues.map(i => ({ path: i.path.map(String).join('.'), message: i.message }))
  const first = issues[0]!
  throw apiError(400, 'invalid-input', first.path ? `${first.path}: ${first.message}` : first.message, { issues })
}

// h3's readValidatedBody replaces our message with "Validation Error"; these keep it.
export async function readValidBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return parseOr400(schema, await readBody(event).catch(() => { throw apiError(400, 'invalid-json', 'The request body is not valid JSON.') }))
}

export function readValidQuery<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return parseOr400(schema, getQuery(event))
}

/**
 * Route parameters (shared/schemas/route-params.ts): one that is not well formed names nothing, so it answers 404 with
 * the schema's words ("No such table."), like a well-formed id that names nothing. It never reaches a database cast.
 */
export function readValidParams<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const result = schema.safeParse(getRouterParams(event, { decode: true }))
  if (result.success) return result.data
  throw apiError(404, 'not-found', result.error.issues[0]!.message)
}
