import { mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { describe, expect, it } from 'vitest'
import TugPicture from '@/components/TugPicture.vue'

function render(wants: { importance?: number }[], hasMeetingPoint: boolean) {
  return mount(TugPicture, { props: { wants, hasMeetingPoint }, global: { plugins: [[Quasar, {}]] } })
}

const strongTug = [{ importance: 10 }, { importance: 10 }]

describe('TugPicture', () => {
  it('carries a visible caption saying it is an illustration, not a measurement', () => {
    const w = render(strongTug, true)
    const caption = w.get('[data-test=tug-picture-caption]')
    expect(caption.element.tagName).toBe('FIGCAPTION')
    expect(caption.text()).toContain('An illustration of the idea, not a measurement of you.')
  })

  it('gives screen readers the effort numbers in plain words', () => {
    const w = render(strongTug, true)
    const alt = w.get('[data-test=tug-picture-alt]')
    expect(alt.attributes('role')).toBe('img')
    const label = alt.attributes('aria-label') ?? ''
    // REFERENCE §7 check values, derived: stuck effort ≈ 500; from above ≈ 4.95, about a hundredth
    expect(label).toContain('Held between two aims')
    expect(label).toContain('together about 500')
    expect(label).toContain('Seen from the meeting point')
    expect(label).toContain('falls to about 5')
    expect(label).toContain('roughly 1% of that')
    expect(w.findAll('svg[aria-hidden=true]')).toHaveLength(2)
  })

  it('draws the second, meeting-point series only when there is a meeting point', () => {
    const without = render(strongTug, false)
    expect(without.find('[data-test=tug-picture-stuck]').exists()).toBe(true)
    expect(without.find('[data-test=tug-picture-meeting]').exists()).toBe(false)
    expect(without.get('[data-test=tug-picture-alt]').attributes('aria-label')).not.toContain('meeting point')

    const withMeeting = render(strongTug, true)
    const meeting = withMeeting.get('[data-test=tug-picture-meeting]')
    expect(meeting.text()).toContain('Seen from the meeting point')
    expect(meeting.findAll('polyline')).toHaveLength(3)
    expect(meeting.find('.tug-picture__aim--shared').exists()).toBe(true)
  })

  it('draws the situation between the two aims in the stuck panel', () => {
    const w = render(strongTug, false)
    const panel = w.get('[data-test=tug-picture-stuck]')
    const aimYs = panel.findAll('line.tug-picture__aim').map((l) => Number(l.attributes('y1')))
    expect(aimYs).toHaveLength(2)
    const [top, bottom] = [Math.min(...aimYs), Math.max(...aimYs)]
    const situation = panel.get('polyline.tug-picture__situation').attributes('points') ?? ''
    const ys = situation.split(' ').slice(1).map((pt) => Number(pt.split(',')[1]))
    expect(ys.length).toBeGreaterThan(10)
    expect(ys.every((y) => y > top && y < bottom)).toBe(true)
  })

  it.each([
    ['a missing want', [{ importance: 6 }]],
    ['importance 0 on one side', [{ importance: 0 }, { importance: 6 }]],
    ['no importance given', [{}, { importance: 6 }]],
    ['no wants', []],
  ])('says plainly there is no pull to draw with %s', (_label, wants) => {
    const w = render(wants, true)
    expect(w.get('[data-test=tug-picture-no-pull]').text()).toContain('There is no pull to draw')
    expect(w.find('svg').exists()).toBe(false)
    expect(w.html()).not.toMatch(/NaN|Infinity/)
  })

  it('never shows NaN or Infinity for any mix of importances', () => {
    for (const a of [undefined, 0, 0.5, 1, 5, 10, 14]) {
      for (const b of [undefined, 0, 3, 10]) {
        for (const meeting of [true, false]) {
          const w = render([{ importance: a }, { importance: b }], meeting)
          expect(w.html()).not.toMatch(/NaN|Infinity/)
          w.unmount()
        }
      }
    }
  })
})
