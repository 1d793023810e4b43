import { api } from './client'
import type { UserDto } from '@shared/schemas/auth'

export const signIn = (email: string, password: string) => api<{ user: UserDto }>('POST', '/auth/login', { email, password })
export const signOut = () => api<void>('POST', '/auth/logout')
export const fetchMe = () => api<{ user: UserDto }>('GET', '/auth/me')
export const acceptInvite = (token: string, password: string) => api<{ user: UserDto }>('POST', '/auth/invite/accept', { token, password })
