import { createRouter, createWebHistory, type RouteRecordRaw } from 'vue-router'
import { routes } from './routes'
import { useSessionStore } from '@/stores/session'

export const router = createRouter({
  history: createWebHistory(),
  routes: routes as unknown as RouteRecordRaw[],
})

// Signed-out visitors go to the sign-in page; a role that may not open a page goes home.
router.beforeEach(async (to) => {
  const session = useSessionStore()
  await session.ensureChecked()
  if (to.meta.public) {
    if (to.name === 'sign-in' && session.user) return { name: 'home' }
    return true
  }
  if (!session.user) return { name: 'sign-in', query: to.fullPath === '/' ? {} : { next: to.fullPath } }
  if (to.meta.roles && !to.meta.roles.includes(session.user.role)) return { name: 'home' }
  return true
})

export { routes }
export type { RouteName } from './routes'
