/**
 * The retrofit planner's words and figures for a result: the one-line plan, the before-and-after rows,
 * the figure grid and the pack label. Pure presentation over the engine's result; no formula here.
 */
import { computed, type Ref } from 'vue'
import { CHEMISTRIES, type Chemistry } from '@shared/engine/chemistries'
import type { RetrofitInput, RetrofitResult } from '@shared/engine/retrofit'
import { convert } from '@shared/engine/quantity'
import { formatFigure } from '@shared/schemas/sheet-text'
import type { Figure } from '@/components/results/FigureGrid.vue'

export interface BeforeAfterRow {
  key: string
  label: string
  before: string
  after: string
  note: string
  bad?: boolean
}

export const ma = (a: number) => formatFigure(a * 1000, 'mA')
export const ohms = (v: number) => (v >= 1000 ? formatFigure(v / 1000, 'kΩ') : formatFigure(v, 'Ω'))
export const hours = (h: number) => formatFigure(h, 'h')

export function useRetrofitPlan(
  result: Ref<RetrofitResult | null | undefined>,
  input: Ref<RetrofitInput | null | undefined>,
  chemistry: Ref<Chemistry>,
  diodeChoice: Ref<'silicon' | 'schottky' | 'measured'>,
) {
  /** The nominal pack voltage as the engine used it (from its working, so no formula here). */
  const nominalPackV = computed(() => result.value?.working.find((s) => s.id === 'bypassDiode')?.inputs.find((v) => v.symbol === 'V_nom')?.value ?? null)

  const summary = computed(() => {
    const r = result.value
    if (!r) return ''
    if (!r.e24)
      return `No resistor: ${r.seriesResistanceOhm === null ? 'the target cannot be reached by adding resistance' : 'none is needed'}. Recharge after a full test takes ${hours(r.rechargeTimeAfterH)}.`
    const rating = r.e24.ratingW === null ? 'no listed rating is enough' : `rated ${formatFigure(r.e24.ratingW, 'W')} or more`
    return `Fit ${ohms(r.e24.ohm)} (E24; ${ohms(r.e12?.ohm ?? r.e24.ohm)} from E12), ${rating}, with a ${diodeChoice.value === 'measured' ? 'diode' : diodeChoice.value} diode across it. The trickle falls to ${ma(r.e24.currentA)} (${formatFigure(r.newTrickleCRate, 'C')}).`
  })

  const rows = computed<BeforeAfterRow[]>(() => {
    const r = result.value
    const i = input.value
    if (!r || !i) return []
    const range = `${formatFigure(r.permittedTrickleRangeC.min, '')}–${formatFigure(r.permittedTrickleRangeC.max, 'C')}`
    return [
      {
        key: 'trickle',
        label: 'Trickle current at full charge',
        before: ma(i.trickleCurrent),
        after: ma(r.e24?.currentA ?? i.trickleCurrent),
        note: `target ${ma(r.targetCurrentA)}`,
      },
      {
        key: 'rate',
        label: 'Trickle C-rate',
        before: formatFigure(r.presentTrickleCRate, 'C'),
        after: formatFigure(r.newTrickleCRate, 'C'),
        note: `${chemistry.value.name} tolerates ${range}`,
        bad: !r.trickleWithinLimit,
      },
      {
        key: 'recharge',
        label: 'Recharge after a full rated-duration test',
        before: hours(r.rechargeTimeBeforeH),
        after: hours(r.rechargeTimeAfterH),
        note: r.rechargeWithin24h ? 'within 24 h' : 'over 24 h',
        bad: !r.rechargeWithin24h,
      },
      {
        key: 'load',
        label: 'Load voltage on battery (nominal)',
        before: nominalPackV.value === null ? '—' : formatFigure(nominalPackV.value, 'V'),
        after: formatFigure(r.loadVoltageOnBatteryV, 'V'),
        note: `diode drop ${formatFigure(r.diodeForwardV, 'V')}`,
      },
      {
        key: 'cutoff',
        label: 'Effective cut-off per cell',
        before: formatFigure(chemistry.value.cutoffCellVoltage.value, 'V'),
        after: formatFigure(r.effectiveCutoffCellV, 'V'),
        note: 'the pack now stops higher',
      },
      {
        key: 'runtime',
        label: 'Runtime',
        before: 'as now',
        after: `${formatFigure(r.runtimeChangePct, '%', 2)}`,
        note: 'linear model of pack voltage',
        bad: r.runtimeChangePct <= -10,
      },
      {
        key: 'resistor',
        label: 'Series resistor',
        before: 'none',
        after: r.e24 ? `${ohms(r.e24.ohm)}, up to ${formatFigure(r.e24.dissipationW, 'W')}` : 'none',
        note: r.e24 ? (r.e24.ratingW === null ? 'too hot for any listed rating' : `fit ${formatFigure(r.e24.ratingW, 'W')} or more`) : '',
        bad: !!r.e24 && r.e24.ratingW === null,
      },
    ]
  })

  const figures = computed<Figure[]>(() => {
    const r = result.value
    if (!r) return []
    const out: Figure[] = [
      { key: 'chargerInternalResistanceOhm', label: 'Charger internal resistance', text: ohms(r.chargerInternalResistanceOhm), step: 'chargerThevenin' },
      { key: 'chargerOpenCircuitV', label: 'Charger open-circuit voltage', text: formatFigure(r.chargerOpenCircuitV, 'V'), step: 'chargerThevenin' },
    ]
    if (r.seriesResistanceOhm !== null)
      out.push({ key: 'seriesResistanceOhm', label: 'Exact series resistance', text: ohms(r.seriesResistanceOhm), step: 'seriesResistance' })
    if (r.e24) {
      out.push({ key: 'e24', label: 'New trickle current (E24 value)', text: ma(r.e24.currentA), step: 'standardResistor' })
      out.push({
        key: 'resistorDissipationW',
        label: 'Resistor dissipation, worst case',
        text: formatFigure(r.e24.dissipationW, 'W'),
        step: 'resistorDissipation',
        tone: r.e24.ratingW === null ? 'bad' : undefined,
      })
    }
    out.push({
      key: 'newTrickleCRate',
      label: 'New trickle rate',
      text: formatFigure(r.newTrickleCRate, 'C'),
      step: 'trickleRate',
      tone: r.trickleWithinLimit ? 'good' : 'bad',
    })
    out.push({
      key: 'rechargeTimeAfterH',
      label: 'Recharge time after the change',
      text: hours(r.rechargeTimeAfterH),
      step: 'rechargeTime',
      tone: r.rechargeWithin24h ? 'good' : 'bad',
    })
    if (r.maxSeriesResistanceFor24hOhm !== null)
      out.push({ key: 'maxSeriesResistanceFor24hOhm', label: 'Most resistance within 24 h', text: ohms(r.maxSeriesResistanceFor24hOhm), step: 'rechargeTime' })
    out.push({
      key: 'runtimeChangePct',
      label: 'Runtime change',
      text: formatFigure(r.runtimeChangePct, '%', 2),
      step: 'bypassDiode',
      tone: r.runtimeChangePct <= -10 ? 'bad' : undefined,
    })
    out.push({ key: 'diodeDissipationW', label: 'Diode dissipation on battery', text: formatFigure(r.diodeDissipationW, 'W') })
    return out
  })

  const packLabel = computed(() => {
    const i = input.value
    return i ? `${i.cellsInSeries} × ${CHEMISTRIES[i.chemistry].name}, ${formatFigure(convert(i.capacity, 'C', 'Ah'), 'Ah')}` : ''
  })
  return { summary, rows, figures, packLabel }
}
