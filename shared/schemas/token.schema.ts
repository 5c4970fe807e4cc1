import { z } from 'zod'
import { RoleSchema } from './roles'

export const CreateApiTokenSchema = z.object({
  name: z.string({ required_error: 'is required' }).trim().min(1, 'is required').max(80, 'is too long'),
  /** The token's role; at most the creator's role in the workspace. */
  role: RoleSchema,
})
export type CreateApiToken = z.infer<typeof CreateApiTokenSchema>
