/**
 * The parts of ECharts the route-spacing screens use, registered once. Imported only by the
 * chart component inside a lazily loaded view, so other pages never load ECharts.
 */
import { use } from 'echarts/core'
import { LineChart } from 'echarts/charts'
import { AriaComponent, GridComponent, MarkLineComponent, TooltipComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'

use([LineChart, GridComponent, MarkLineComponent, TooltipComponent, AriaComponent, CanvasRenderer])

export { default as VChart } from 'vue-echarts'
