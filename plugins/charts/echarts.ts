import { registerTheme, use } from 'echarts/core'
import { HeatmapChart, LineChart, ScatterChart } from 'echarts/charts'
import { DataZoomComponent, GridComponent, LegendComponent, TooltipComponent, VisualMapComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'
import VChart, { THEME_KEY } from 'vue-echarts'

// The ECharts parts the app's charts use (components/fill/FillChart, components/table/TablePointsChart, and the two-way
// table's lines and heat map in components/two-way), on a canvas
// (the CSP in nuxt.config.ts allows the style attributes its tooltips set). Loaded by plugins/charts.client.ts.
use([LineChart, ScatterChart, HeatmapChart, GridComponent, TooltipComponent, LegendComponent, DataZoomComponent, VisualMapComponent, CanvasRenderer])

// Dark pages (composables/useTheme.ts): light labels and axes, faint split lines, a dark tooltip; series colours are the
// charts' own. plugins/charts.client.ts hands the theme name to every chart.
const text = '#cbd2d8'
const axis = { axisLine: { lineStyle: { color: '#7a8691' } }, axisTick: { lineStyle: { color: '#7a8691' } }, axisLabel: { color: text }, splitLine: { lineStyle: { color: '#2c363f' } }, nameTextStyle: { color: text } }
registerTheme('knotwork-dark', {
  backgroundColor: 'transparent',
  textStyle: { color: text },
  legend: { textStyle: { color: text }, pageTextStyle: { color: text } },
  tooltip: { backgroundColor: '#1a2127', borderColor: '#34404a', textStyle: { color: '#eef1f3' } },
  valueAxis: axis, categoryAxis: axis, logAxis: axis, timeAxis: axis,
  dataZoom: { textStyle: { color: text }, borderColor: '#34404a', fillerColor: 'rgba(159,208,200,0.15)', dataBackground: { lineStyle: { color: '#7a8691' }, areaStyle: { color: '#2c363f' } } },
  visualMap: { textStyle: { color: text } },
})

export { THEME_KEY, VChart }
