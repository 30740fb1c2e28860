// Screenshots of the main screens at phone and desktop size, for looking at by eye: npx tsx scripts/screens.ts [baseUrl]
import fs from 'node:fs'
import { freshContext } from '../helpers/chromium'

const base = process.argv[2] ?? 'http://localhost:3000'
const out = '.screens'
fs.mkdirSync(out, { recursive: true })
const shots: { name: string; path: string; signIn?: [string, string]; helpNow?: boolean; dark?: boolean }[] = [
  { name: 'today', path: '/' },
  { name: 'today-help', path: '/', helpNow: true },
  { name: 'more', path: '/more' },
  { name: 'settings-dark', path: '/more/settings', dark: true },
  { name: 'signin', path: '/signin' },
  { name: 'signup', path: '/signup' },
  { name: 'therapist', path: '/therapist/settings', signIn: ['amara.quint@fernhill.example', 'demo-therapist-kettle'] },
  { name: 'admin-approvals', path: '/admin/approvals', signIn: ['admin@fernhill.example', 'demo-admin-ledger'] },
  { name: 'admin-accounts', path: '/admin/accounts', signIn: ['admin@fernhill.example', 'demo-admin-ledger'] },
  { name: 'notfound', path: '/nowhere' },
]
for (const [size, w, h] of [['phone', 390, 844], ['desktop', 1280, 800]] as const) {
  for (const s of shots) {
    const { context, close } = await freshContext({ width: w, height: h, colorScheme: s.dark ? 'dark' : 'light' })
    const page = await context.newPage()
    if (s.signIn) {
      await page.goto(base + '/signin')
      await page.getByLabel('E-mail').fill(s.signIn[0])
      await page.getByLabel('Password').fill(s.signIn[1])
      await page.getByRole('button', { name: 'Sign in' }).click()
      await page.waitForURL((u) => !u.pathname.startsWith('/signin'))
    }
    await page.goto(base + s.path)
    await page.waitForTimeout(700)
    if (s.helpNow) {
      await page.getByRole('button', { name: 'Help now' }).click()
      await page.waitForTimeout(500)
    }
    await page.screenshot({ path: `${out}/${size}-${s.name}.png`, fullPage: false })
    await close()
  }
}
console.log(`screenshots in ${out}/`)
