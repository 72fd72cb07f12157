import type VChartComponent from 'vue-echarts'

// The chart library, registered once for the whole app: <VChart> (vue-echarts) with the ECharts parts the app draws
// with (plugins/charts/echarts.ts). The library is its own chunk, loaded with the first chart on screen, not with
// every page. Charts render in the browser only (the *.client.vue components; *.server.vue keeps their place).
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.vueApp.component('VChart', defineAsyncComponent(() => import('./charts/echarts').then(m => m.VChart)))
})

declare module 'vue' {
  interface GlobalComponents { VChart: typeof VChartComponent }
}
