import { z } from 'zod'
import { ROLES } from './roles'

const email = z.string({ error: 'Enter an e-mail address.' })
  .trim().toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address, such as name@example.org.' }))

export const PASSWORD_MIN_LENGTH = 10

export const newPassword = z.string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, { error: `Use at least ${PASSWORD_MIN_LENGTH} characters.` })
  .max(200, { error: 'Use at most 200 characters.' })

export const signInSchema = z.object({
  email,
  password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200)
})
export type SignIn = z.infer<typeof signInSchema>

const displayName = z.string({ error: 'Enter a name.' }).trim()
  .min(1, { error: 'Enter a name.' })
  .max(120, { error: 'Use at most 120 characters.' })

const role = z.enum(ROLES, { error: `Choose a role: ${ROLES.join(', ')}.` })

export const createUserSchema = z.object({
  email,
  displayName,
  role
})
export type CreateUser = z.infer<typeof createUserSchema>

export const updateUserSchema = z.object({
  displayName: displayName.optional(),
  role: role.optional(),
  active: z.boolean({ error: 'Active must be true or false.' }).optional()
}).refine(v => v.displayName !== undefined || v.role !== undefined || v.active !== undefined, {
  error: 'Nothing to change.'
})
export type UpdateUser = z.infer<typeof updateUserSchema>

export const USER_SORTS = ['displayName', 'email', 'role', 'lastSignInAt', 'createdAt'] as const

export const listUsersQuerySchema = z.object({
  q: z.string().trim().max(120).optional(),
  sort: z.enum(USER_SORTS, { error: `Sort by one of: ${USER_SORTS.join(', ')}.` }).default('displayName'),
  dir: z.enum(['asc', 'desc'], { error: 'Direction is asc or desc.' }).default('asc')
})

export const passwordResetRequestSchema = z.object({ email })

export const setPasswordSchema = z.object({
  password: newPassword,
  confirm: z.string({ error: 'Repeat the password.' })
}).refine(v => v.password === v.confirm, { error: 'The two passwords differ.', path: ['confirm'] })

export const idParamSchema = z.object({ id: z.uuid() })
export const tokenParamSchema = z.object({ token: z.string().min(20).max(200) })
