// The parts of ECharts Fanlight's charts use, registered once. Import this module only from chart
// components that are themselves loaded lazily: ECharts is most of the client's weight.
import { use } from 'echarts/core'
import { CanvasRenderer } from 'echarts/renderers'
import { BarChart, LineChart, ScatterChart } from 'echarts/charts'
import { GridComponent, LegendComponent, MarkAreaComponent, TooltipComponent } from 'echarts/components'
import VChart from 'vue-echarts'

use([CanvasRenderer, BarChart, LineChart, ScatterChart, GridComponent, LegendComponent, MarkAreaComponent, TooltipComponent])

export { VChart }
