import { api } from './client'
import type { InviteBody, OrganisationDto, OutboxMessageDto, UserDto, UserPatchBody } from '@shared/schemas/auth'

export const listUsers = () => api<UserDto[]>('GET', '/users')
export const inviteUser = (body: InviteBody) => api<UserDto>('POST', '/users', body)
export const patchUser = (id: string, body: UserPatchBody) => api<UserDto>('PATCH', `/users/${encodeURIComponent(id)}`, body)
export const listOrganisations = () => api<OrganisationDto[]>('GET', '/organisations')
export const listOutbox = () => api<OutboxMessageDto[]>('GET', '/outbox')
