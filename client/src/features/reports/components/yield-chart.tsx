import { lazyChart } from './lazy-chart'

/** Material yield per week, planned and actual; drawn by `yield-chart-drawing.tsx`. */
export const YieldChart = lazyChart(() => import('./yield-chart-drawing').then((m) => m.YieldChart))
