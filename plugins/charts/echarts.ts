import { use } from 'echarts/core'
import { LineChart, ScatterChart } from 'echarts/charts'
import { DataZoomComponent, GridComponent, LegendComponent, TooltipComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'
import VChart from 'vue-echarts'

// The ECharts parts the app's charts use (components/fill/FillChart, components/table/TablePointsChart), on a canvas
// (the CSP in nuxt.config.ts allows the style attributes its tooltips set). Loaded by plugins/charts.client.ts.
use([LineChart, ScatterChart, GridComponent, TooltipComponent, LegendComponent, DataZoomComponent, CanvasRenderer])

export { VChart }
