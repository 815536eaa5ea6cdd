// chart.js with the parts our charts use, registered once, and vue-chartjs's components. Loaded
// only when a chart first renders (see lazyChart), so pages without a chart never download it.
import {
  BarController, BarElement, CategoryScale, Chart, Filler, Legend, LinearScale, LineController,
  LineElement, LogarithmicScale, PointElement, ScatterController, Tooltip
} from 'chart.js'
import { Bar, Line, Scatter } from 'vue-chartjs'

Chart.register(BarController, BarElement, CategoryScale, Filler, Legend, LinearScale, LineController, LineElement, LogarithmicScale, PointElement, ScatterController, Tooltip)
Chart.defaults.font.family = '"IBM Plex Sans", system-ui, sans-serif'
Chart.defaults.color = '#37434e'

export const charts = { Bar, Line, Scatter }
