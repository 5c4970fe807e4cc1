/**
 * The one place ECharts is set up: the chart types and components any screen uses, registered once.
 * Only chart components import this module, and they sit inside lazily loaded views, so pages
 * without a chart never load ECharts.
 */
import { use } from 'echarts/core'
import { BarChart, LineChart } from 'echarts/charts'
import { AriaComponent, DataZoomComponent, GridComponent, LegendComponent, MarkLineComponent, TooltipComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'

use([BarChart, LineChart, GridComponent, LegendComponent, MarkLineComponent, TooltipComponent, DataZoomComponent, AriaComponent, CanvasRenderer])

export { default as VChart } from 'vue-echarts'
