import { lazyChart } from './lazy-chart'

/** Units built (bars) and shipped (line) per day; drawn by `throughput-chart-drawing.tsx`. */
export const ThroughputChart = lazyChart(() => import('./throughput-chart-drawing').then((m) => m.ThroughputChart))
