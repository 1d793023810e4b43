import { z } from 'zod'
import { ROLES } from '../roles'

export const loginBody = z.strictObject({
  email: z.email().max(254).transform((s) => s.toLowerCase()),
  password: z.string().min(1).max(256),
})
export type LoginBody = z.infer<typeof loginBody>

export const organisationDto = z.object({
  id: z.string(),
  name: z.string(),
  kind: z.enum(['agency', 'city']),
  unitSystem: z.enum(['metric', 'us']),
})
export type OrganisationDto = z.infer<typeof organisationDto>

export const userDto = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  active: z.boolean(),
  organisation: organisationDto,
})
export type UserDto = z.infer<typeof userDto>

export const inviteBody = z.strictObject({
  email: z.email().max(254).transform((s) => s.toLowerCase()),
  name: z.string().trim().min(1).max(120),
  role: z.enum(ROLES),
  organisationId: z.string().min(1),
})
export type InviteBody = z.infer<typeof inviteBody>

export const userPatchBody = z.strictObject({
  role: z.enum(ROLES).optional(),
  active: z.boolean().optional(),
}).refine((b) => b.role !== undefined || b.active !== undefined, { message: 'Give a role or an active flag.' })
export type UserPatchBody = z.infer<typeof userPatchBody>

export const acceptInviteBody = z.strictObject({
  token: z.string().min(20).max(200),
  password: z.string().min(10, 'Use at least 10 characters.').max(256),
})
export type AcceptInviteBody = z.infer<typeof acceptInviteBody>

export const idParams = z.object({ id: z.string().min(1).max(100) })

export const outboxMessageDto = z.object({
  id: z.number(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  createdAt: z.string(),
})
export type OutboxMessageDto = z.infer<typeof outboxMessageDto>

export const organisationPatchBody = z.strictObject({
  unitSystem: z.enum(['metric', 'us']),
})
export type OrganisationPatchBody = z.infer<typeof organisationPatchBody>
