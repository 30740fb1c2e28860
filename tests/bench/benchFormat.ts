// Number formatting shared by every section of the bench report.
import type { Spread } from './benchResults'

export const group = (n: number) => String(Math.round(n)).replace(/\B(?=(\d{3})+(?!\d))/g, ' ')
export const ms = (n: number) => (n >= 100 ? group(n) : n.toFixed(n >= 10 ? 1 : 2))
export const trio = (s: Spread) => `${ms(s.median)} / ${ms(s.p95)} / ${ms(s.max)} ms`
export const misses = (over: boolean) => (over ? '   MISSES BUDGET' : '')
export const row = (label: string, figure: string, rest = '') => `  ${label.padEnd(72)} ${figure.padStart(22)}${rest}`
export const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} KB`
