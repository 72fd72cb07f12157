import type VChartComponent from 'vue-echarts'

// The chart library, registered once for the whole app: <VChart> (vue-echarts) with the ECharts parts the app draws
// with (plugins/charts/echarts.ts). The library is its own chunk, loaded with the first chart on screen, not with
// every page. Charts render in the browser only (the *.client.vue components; *.server.vue keeps their place).
// On dark pages every chart takes the 'knotwork-dark' theme (plugins/charts/echarts.ts), given to all charts at once.
export default defineNuxtPlugin((nuxtApp) => {
  const { dark } = useTheme()
  const theme = computed(() => dark.value ? 'knotwork-dark' : undefined)
  nuxtApp.vueApp.component('VChart', defineAsyncComponent(() => import('./charts/echarts').then((m) => {
    nuxtApp.vueApp.provide(m.THEME_KEY, theme)
    return m.VChart
  })))
})

declare module 'vue' {
  interface GlobalComponents { VChart: typeof VChartComponent }
}
