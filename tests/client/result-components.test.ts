/** The shared result components: headline figures that open their working, and warnings in words. */
import { mount as mountBare, flushPromises } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { afterEach, describe, expect, it } from 'vitest'
import type { EngineWarning, WorkingStep } from '../../shared/engine/types'
import FigureGrid from '../../src/components/results/FigureGrid.vue'
import WarningList from '../../src/components/results/WarningList.vue'

const STEP: WorkingStep = {
  id: 'apparentPower',
  label: 'Apparent power',
  formula: 'S = U · I',
  explanation: 'Supply voltage times the measured current.',
  inputs: [
    { symbol: 'U', label: 'Supply voltage', value: 230, unit: 'V' },
    { symbol: 'I', label: 'Mains current', value: 0.0257, unit: 'A' },
  ],
  result: { symbol: 'S', label: 'Apparent power', value: 5.911, unit: 'VA' },
  references: [{ source: 'IEC 60050-131, apparent power', basis: 'published' }],
}

/** The components read the reader's unit preference from the auth store: a fresh store, signed out (SI). */
const mount: typeof mountBare = ((component: Parameters<typeof mountBare>[0], options: Record<string, unknown> = {}) =>
  mountBare(component, { ...options, global: { plugins: [createPinia()] } })) as typeof mountBare

afterEach(() => {
  document.body.innerHTML = ''
})

describe('FigureGrid', () => {
  const figures = [
    { key: 'apparentPowerVA', label: 'Apparent power', text: '5.91 VA', step: 'apparentPower' },
    { key: 'powerFactor', label: 'Power factor', text: '0.44', step: 'powerFactor', tone: 'bad' as const },
    { key: 'note', label: 'Tariff', text: '0.28' },
  ]

  it('shows each figure with its text; only a figure whose step is in the working is a button', () => {
    const w = mount(FigureGrid, { props: { figures, working: [STEP] }, attachTo: document.body })
    expect(w.get('[data-test="value-apparentPowerVA"]').text()).toBe('5.91 VA')
    expect(w.get('[data-test="figure-apparentPowerVA"]').element.tagName).toBe('BUTTON')
    // powerFactor names a step the working does not hold, so it is not offered as a link to nothing.
    expect(w.get('[data-test="figure-powerFactor"]').element.tagName).toBe('DIV')
    expect(w.get('[data-test="figure-note"]').element.tagName).toBe('DIV')
    expect(w.get('[data-test="figure-powerFactor"]').classes()).toContain('lw-fig-bad')
    w.unmount()
  })

  it('opens the working step behind a figure when it is clicked', async () => {
    const w = mount(FigureGrid, { props: { figures, working: [STEP] }, attachTo: document.body })
    expect(document.body.querySelector('[data-test="working-apparentPower"]')).toBeNull()
    await w.get('[data-test="figure-apparentPowerVA"]').trigger('click')
    await flushPromises()
    const shown = document.body.querySelector('[data-test="working-apparentPower"]')
    expect(shown).not.toBeNull()
    expect(shown!.textContent).toContain('S = U · I')
    expect(shown!.textContent).toContain('IEC 60050-131')
    w.unmount()
  })
})

describe('WarningList', () => {
  const warnings: EngineWarning[] = [
    { code: 'low-reading', severity: 'info', message: 'measuredPower is below the meter limit' },
    { code: 'over-claim', severity: 'critical', message: 'measuredPower exceeds claimedPower' },
    { code: 'pf', severity: 'warning', message: 'powerFactor is low' },
  ]

  it('lists the most severe first, each headed by its severity in words', () => {
    const w = mount(WarningList, { props: { warnings } })
    const order = w.findAll('[data-test^="warning-"]').map((el) => el.attributes('data-test'))
    expect(order).toEqual(['warning-critical', 'warning-warning', 'warning-info'])
    expect(w.get('[data-test="warning-critical"]').text()).toContain('Critical')
    expect(w.get('[data-test="warning-info"]').text()).toContain('Note')
  })

  it('replaces field keys by the words given, and starts the sentence with a capital', () => {
    const words = { measuredPower: 'the measured power', claimedPower: 'the claimed power' }
    const w = mount(WarningList, { props: { warnings, words } })
    const critical = w.get('[data-test="warning-critical"]').text()
    expect(critical).toContain('The measured power exceeds the claimed power')
    expect(critical).not.toContain('measuredPower')
  })

  it('says so when there is nothing to warn about', () => {
    const w = mount(WarningList, { props: { warnings: [], emptyText: 'No warnings: the readings agree.' } })
    expect(w.get('[data-test="no-warnings"]').text()).toBe('No warnings: the readings agree.')
    expect(w.findAll('[data-test^="warning-"]')).toHaveLength(0)
  })
})
