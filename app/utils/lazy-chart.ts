import { defineAsyncComponent } from 'vue'

/**
 * A vue-chartjs chart whose code (chart.js included, about 70 kB gzipped) is fetched the first
 * time it renders, so it lives in its own chunk instead of every page's first load.
 */
export function lazyChart(kind: 'Bar' | 'Line' | 'Scatter') {
  return defineAsyncComponent(async () => (await import('./charts/registered')).charts[kind])
}
