/**
 * The parts of ECharts the pack screens use, registered once. Imported only by the chart
 * components inside lazily loaded views, so the first page never loads ECharts.
 */
import { use } from 'echarts/core'
import { BarChart, LineChart } from 'echarts/charts'
import { GridComponent, LegendComponent, MarkLineComponent, TooltipComponent, AriaComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'

use([BarChart, LineChart, GridComponent, LegendComponent, MarkLineComponent, TooltipComponent, AriaComponent, CanvasRenderer])

export { default as VChart } from 'vue-echarts'
