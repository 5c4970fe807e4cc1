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

/** The answer of the routes that only confirm. */
export const MessageSchema = z.object({ message: z.string() })

/** The client's view of an answer: what JSON carries (dates as text). */
export type Answer<S extends z.ZodTypeAny> = z.output<S>
