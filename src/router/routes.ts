import type { RouteRecordRaw } from 'vue-router'
import type { Role } from '@shared/roles'

declare module 'vue-router' {
  interface RouteMeta {
    /** Reachable without signing in. */
    public?: boolean
    /** Roles that may open the page; every signed-in role when absent. */
    roles?: Role[]
    /** Shown in the sidebar when set, sorted by order. */
    nav?: { label: string; icon: string; order: number }
  }
}

const ALL: Role[] = ['planner', 'engineer', 'manager', 'admin']

// Each feature adds its pages here; the sidebar is built from these records and the user's role.
export const routes = [
  { path: '/sign-in', name: 'sign-in', component: () => import('@/views/SignInView.vue'), meta: { public: true } },
  { path: '/invite/:token', name: 'invite', component: () => import('@/views/InviteAcceptView.vue'), meta: { public: true } },
  {
    path: '/', name: 'home', component: () => import('@/views/HomeView.vue'),
    meta: { roles: ALL, nav: { label: 'Home', icon: 'pi pi-home', order: 0 } },
  },
  {
    path: '/proposals', name: 'proposals', component: () => import('@/views/ProposalListView.vue'),
    meta: { roles: ['planner', 'manager'], nav: { label: 'Proposals', icon: 'pi pi-sliders-h', order: 40 } },
  },
  {
    path: '/proposals/:id', name: 'proposal', component: () => import('@/views/ProposalView.vue'),
    meta: { roles: ['planner', 'manager'] },
  },
  {
    path: '/agreement', name: 'agreement', component: () => import('@/views/AgreementView.vue'),
    meta: { roles: ALL, nav: { label: 'Agreement', icon: 'pi pi-check-square', order: 50 } },
  },
  {
    path: '/people', name: 'users', component: () => import('@/views/UserListView.vue'),
    meta: { roles: ['admin'], nav: { label: 'People', icon: 'pi pi-users', order: 80 } },
  },
  {
    path: '/outbox', name: 'outbox', component: () => import('@/views/OutboxView.vue'),
    meta: { roles: ['admin'], nav: { label: 'Outbox', icon: 'pi pi-envelope', order: 90 } },
  },
  {
    path: '/corridors', name: 'corridors', component: () => import('@/views/CorridorListView.vue'),
    meta: { roles: ALL, nav: { label: 'Corridors', icon: 'pi pi-directions', order: 20 } },
  },
  {
    path: '/corridors/:id', name: 'corridor', component: () => import('@/views/CorridorDetailView.vue'), props: true,
    meta: { roles: ALL },
  },
  {
    path: '/signals', name: 'signals', component: () => import('@/views/SignalListView.vue'),
    meta: { roles: ALL, nav: { label: 'Signals', icon: 'pi pi-stop-circle', order: 30 } },
  },
  {
    path: '/signals/:id', name: 'signal', component: () => import('@/views/SignalDetailView.vue'), props: true,
    meta: { roles: ALL },
  },
  {
    path: '/calculator', name: 'calculator', component: () => import('@/views/ApproachCalculatorView.vue'),
    meta: { roles: ALL, nav: { label: 'Calculator', icon: 'pi pi-calculator', order: 60 } },
  },
  {
    path: '/observed', name: 'observed', component: () => import('@/views/ObservedView.vue'),
    meta: { roles: ['planner', 'engineer', 'manager'], nav: { label: 'Observed', icon: 'pi pi-chart-line', order: 70 } },
  },
  {
    path: '/feeds', name: 'feeds', component: () => import('@/views/FeedListView.vue'),
    meta: { roles: ['planner', 'manager', 'admin'], nav: { label: 'Feeds', icon: 'pi pi-database', order: 10 } },
  },
  {
    path: '/feeds/:id', name: 'feed', component: () => import('@/views/FeedDetailView.vue'), props: true,
    meta: { roles: ['planner', 'manager', 'admin'] },
  },
  {
    path: '/savings', name: 'savings', component: () => import('@/views/SavingsDashboardView.vue'),
    meta: { roles: ['planner', 'manager'], nav: { label: 'Savings', icon: 'pi pi-money-bill', order: 45 } },
  },
  {
    path: '/savings/report/:id', name: 'report', component: () => import('@/views/SavingsReportView.vue'), props: true,
    meta: { roles: ['planner', 'manager'] },
  },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue'), meta: { public: true } },
] as const satisfies readonly RouteRecordRaw[]

export type RouteName = (typeof routes)[number]['name']
