import { api } from './client'
import type { InviteBody, OrganisationDto, OrganisationPatchBody, OutboxMessageDto, UserDto, UserPatchBody } from '@shared/schemas/auth'

export const listUsers = () => api<UserDto[]>('GET', '/users')
export const inviteUser = (body: InviteBody) => api<UserDto>('POST', '/users', body)
export const patchUser = (id: string, body: UserPatchBody) => api<UserDto>('PATCH', `/users/${encodeURIComponent(id)}`, body)
export const listOrganisations = () => api<OrganisationDto[]>('GET', '/organisations')
export const listOutbox = () => api<OutboxMessageDto[]>('GET', '/outbox')
export const patchOrganisation = (id: string, body: OrganisationPatchBody) => api<OrganisationDto>('PATCH', `/organisations/${encodeURIComponent(id)}`, body)
