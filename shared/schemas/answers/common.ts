/**
 * Building blocks of the API's answers. An answer schema is written once here and used three
 * times: the route declares it (`response:`), so the server's handler must return that shape; the
 * client's API functions take their types from it; the OpenAPI document describes it.
 */
import { z } from 'zod'

/**
 * A moment in time: the server hands over a Date (or an ISO text read from SQL) and JSON carries
 * it as ISO 8601 text, which is what the client receives.
 */
export const Timestamp = z.union([z.date(), z.string()]).transform((v) => (typeof v === 'string' ? v : v.toISOString()))

/** A person named on a record (author, issuer); null when the account is gone. */
export const PersonSchema = z.object({ id: z.string(), name: z.string() })

/** Stored engine inputs or results: passed on as saved (their shape is the engine tool's). */
export const StoredJson = z.record(z.unknown())

/**
 * Engine output or form values stored as JSON and passed on as saved. The server holds a plain
 * record; the client reads it as `T`, the type of what wrote it (the engine version is stored beside
 * it). OpenAPI describes it as an object.
 */
export const storedAs = <T>(description: string) => StoredJson.describe(description).transform((v) => v as unknown as T)

/**
 * A part of an answer computed by the engine on request, typed by the engine's own interface `T`.
 * Answers are not parsed at run time (the schema types the handler and describes the document), so
 * the engine's type stays the one definition; OpenAPI describes it as an object.
 */
export const engineShape = <T>(description: string) => z.record(z.unknown()).describe(description) as unknown as z.ZodType<T, z.ZodTypeDef, T>

/** The answer of the routes that only confirm. */
export const MessageSchema = z.object({ message: z.string() })

/** The client's view of an answer: what JSON carries (dates as text). */
export type Answer<S extends z.ZodTypeAny> = z.output<S>

/** A source named beside a rule or value (standard and clause, handbook), as the engine gives it. */
export const ReferenceSchema = z.object({
  source: z.string(),
  basis: z.enum(['published', 'common practice', 'from memory', 'derived']),
  note: z.string().optional(),
})

/** One engine warning, as every tool gives them. */
export const EngineWarningSchema = z.object({
  code: z.string(),
  severity: z.enum(['critical', 'warning', 'info']),
  message: z.string(),
  /** The input field the warning is about, when there is one. */
  field: z.string().optional(),
})

/** A calendar day as "YYYY-MM-DD". */
export const IsoDay = z.string()
