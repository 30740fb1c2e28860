import { createRouter, createWebHistory } from 'vue-router'
import { useSessionStore } from '@/stores/session'
import { homeFor } from './homeFor'
import { RouteName } from './names'
import { routes } from './routes'

export const router = createRouter({
  history: createWebHistory(),
  routes,
  scrollBehavior: () => ({ top: 0 }),
})

// The one guard: routes that name roles need a signed-in user with one of them. The server checks again.
router.beforeEach(async (to) => {
  const roles = to.matched.flatMap((r) => r.meta.roles ?? [])
  if (!roles.length) return true
  const session = useSessionStore()
  await session.ready()
  if (!session.me) return { name: RouteName.SignIn, query: { redirect: to.fullPath } }
  if (!roles.includes(session.me.role)) return { name: homeFor(session.me.role) }
  return true
})

router.afterEach((to) => {
  document.title = to.meta.title ? `${to.meta.title} · Rungs` : 'Rungs'
})
