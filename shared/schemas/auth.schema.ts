/** Accounts: the one zod schema per concept, used by the server's checks and the client's forms. */
import { z } from 'zod'
import { MeAnswer } from './answers/accounts'
import { RoleSchema } from './roles'

/** A few passwords too common to allow whatever their length (screened, as current guidance asks). */
const TOO_COMMON = new Set([
  'password1234',
  '123456789012',
  'qwertyuiopas',
  'passwordpassword',
  'letmein12345',
  'iloveyou1234',
  'emergency123',
  'lampwright123',
])

export const EmailSchema = z
  .string({ required_error: 'is required' })
  .trim()
  .toLowerCase()
  .min(3, 'is required')
  .max(254, 'is too long')
  .email('is not an e-mail address')

/** Length over composition rules: 12 to 128 characters, any characters, not a known common password. */
export const PasswordSchema = z
  .string({ required_error: 'is required' })
  .min(12, 'must be at least 12 characters (a short phrase works well)')
  .max(128, 'must be at most 128 characters')
  .refine((p) => !TOO_COMMON.has(p.toLowerCase()), 'is too common; choose another')

export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string({ required_error: 'is required' }).min(1, 'is required').max(128, 'is too long'),
})
export type SignIn = z.infer<typeof SignInSchema>

export const SignUpSchema = z.object({
  email: EmailSchema,
  password: PasswordSchema,
  name: z.string({ required_error: 'is required' }).trim().min(1, 'is required').max(120, 'is too long'),
  /** Name of a new team workspace; omitted when accepting an invitation. */
  workspaceName: z.string().trim().min(1, 'is required').max(120, 'is too long').optional(),
  /** An invitation token to accept on sign-up. */
  invitation: z.string().min(10).max(200).optional(),
})
export type SignUp = z.infer<typeof SignUpSchema>

export const ForgotPasswordSchema = z.object({ email: EmailSchema })
export const ResetPasswordSchema = z.object({
  token: z.string({ required_error: 'is required' }).min(10, 'is not a valid reset token').max(200),
  password: PasswordSchema,
})

export const ConfirmEmailSchema = z.object({
  token: z.string({ required_error: 'is required' }).min(10, 'is not a valid confirmation token').max(200),
})

export const ChangePasswordSchema = z.object({
  currentPassword: z.string({ required_error: 'is required' }).min(1, 'is required').max(128, 'is too long'),
  newPassword: PasswordSchema,
})
export type ChangePassword = z.infer<typeof ChangePasswordSchema>

export const UpdateProfileSchema = z.object({
  name: z.string().trim().min(1, 'is required').max(120, 'is too long').optional(),
  units: z.enum(['si', 'us']).optional(),
})

export const InviteSchema = z.object({ email: EmailSchema, role: RoleSchema })
export const ChangeRoleSchema = z.object({ role: RoleSchema })
export const SwitchWorkspaceSchema = z.object({ workspaceId: z.string().uuid('is not a workspace id') })
export const CreateWorkspaceSchema = z.object({ name: z.string().trim().min(1, 'is required').max(120, 'is too long') })

/** The answer to "who am I" (sign-in, sign-up, /api/auth/me, switching workspace). */
export type MeResponse = z.output<typeof MeAnswer>
