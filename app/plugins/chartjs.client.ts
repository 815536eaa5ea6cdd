import {
  BarController, BarElement, CategoryScale, Chart, Filler, Legend, LinearScale, LineController,
  LineElement, LogarithmicScale, PointElement, ScatterController, Tooltip
} from 'chart.js'

export default defineNuxtPlugin(() => {
  Chart.register(BarController, BarElement, CategoryScale, Filler, Legend, LinearScale, LineController, LineElement, LogarithmicScale, PointElement, ScatterController, Tooltip)
  Chart.defaults.font.family = '"IBM Plex Sans", system-ui, sans-serif'
  Chart.defaults.color = '#37434e'
})
