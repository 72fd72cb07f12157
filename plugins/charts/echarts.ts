import { use } from 'echarts/core'
import { HeatmapChart, LineChart, ScatterChart } from 'echarts/charts'
import { DataZoomComponent, GridComponent, LegendComponent, TooltipComponent, VisualMapComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'
import VChart from 'vue-echarts'

// The ECharts parts the app's charts use (components/fill/FillChart, components/table/TablePointsChart, and the two-way
// table's lines and heat map in components/two-way), on a canvas
// (the CSP in nuxt.config.ts allows the style attributes its tooltips set). Loaded by plugins/charts.client.ts.
use([LineChart, ScatterChart, HeatmapChart, GridComponent, TooltipComponent, LegendComponent, DataZoomComponent, VisualMapComponent, CanvasRenderer])

export { VChart }
