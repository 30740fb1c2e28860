import { mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { describe, expect, it } from 'vitest'
import PatternsHeatmap from '@/components/PatternsHeatmap.vue'
import type { Entry } from '@shared/schemas/entry.schema'

let seq = 0
function at(date: Date, distressBefore?: number): Entry {
  seq++
  const e: Entry = {
    id: `00000000-0000-4000-8000-${String(seq).padStart(12, '0')}`,
    kind: 'moment',
    createdAt: date.getTime(),
    updatedAt: 0,
    version: 1,
    body: '',
    wants: [],
    backgroundThoughts: [],
    tags: [],
    shares: [],
  }
  if (distressBefore !== undefined) e.distressBefore = distressBefore
  return e
}

function mountHeatmap(entries: Entry[]) {
  return mount(PatternsHeatmap, { props: { entries, period: '30d' }, global: { plugins: [[Quasar, {}]] } })
}

describe('PatternsHeatmap', () => {
  // 1 and 8 January 2024 were Mondays; local-time constructors keep this true in any time zone.
  const entries = [at(new Date(2024, 0, 1, 19, 30), 40), at(new Date(2024, 0, 8, 20, 0), 61), at(new Date(2024, 0, 5, 9, 0))]

  it('draws a table with a row per weekday, labelled, and a column per part of the day', () => {
    const w = mountHeatmap(entries)
    const rows = w.findAll('tbody tr')
    expect(rows).toHaveLength(7)
    expect(rows.map((r) => r.find('th[scope=row] .sr-only').text())).toEqual(['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'])
    expect(w.findAll('thead th[scope=col]').map((th) => th.text())).toEqual(['Night00–06', 'Morning06–12', 'Afternoon12–18', 'Evening18–24'])
  })

  it('shows the count and average distress in the Monday evening cell, and shades it most', () => {
    const w = mountHeatmap(entries)
    const cell = w.get('[data-test=heat-0-evening]')
    expect(cell.find('.heat-count').text()).toBe('2')
    expect(cell.find('.heat-mean').text()).toBe('avg 51')
    expect(cell.classes()).toContain('heat-level-4')
    expect(w.get('[data-test=heat-4-morning] .heat-count').text()).toBe('1')
    expect(w.get('[data-test=heat-4-morning]').classes()).toContain('heat-level-2')
    expect(w.get('[data-test=heat-2-night] .heat-count').text()).toBe('0')
    expect(w.get('[data-test=heatmap-summary]').text()).toBe('Over the last 30 days, 3 entries were recorded. Monday evenings had the most, with 2.')
  })

  it('shows no table and a plain sentence when the period is empty', () => {
    const w = mountHeatmap([])
    expect(w.find('table').exists()).toBe(false)
    expect(w.get('[data-test=heatmap-summary]').text()).toBe('Nothing recorded in this period yet.')
  })
})
