import { z } from 'zod'
import { RoleSchema } from './roles'

/** What an API token may do: read (GET routes), write (every change), calc (the engine tools). */
export const TOKEN_SCOPES = ['read', 'write', 'calc'] as const
export const TokenScopeSchema = z.enum(TOKEN_SCOPES, { errorMap: () => ({ message: 'must be read, write or calc' }) })
export type TokenScope = z.infer<typeof TokenScopeSchema>

export const CreateApiTokenSchema = z.object({
  name: z.string({ required_error: 'is required' }).trim().min(1, 'is required').max(80, 'is too long'),
  /** The token's role; at most the creator's role in the workspace. */
  role: RoleSchema,
  /** What the token may do; all three when not given. */
  scopes: z
    .array(TokenScopeSchema, { invalid_type_error: 'must be a list of scopes' })
    .min(1, 'needs at least one scope')
    .refine((s) => new Set(s).size === s.length, 'lists a scope twice')
    .default([...TOKEN_SCOPES]),
  /** When the token stops working (ISO 8601 with a zone); null or absent: until revoked. */
  expiresAt: z.string().datetime({ offset: true, message: 'must be a date and time with its zone, e.g. 2027-01-31T17:00:00Z' }).nullable().default(null),
})
export type CreateApiToken = z.infer<typeof CreateApiTokenSchema>
