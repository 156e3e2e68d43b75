import { lazyChart } from './lazy-chart'

/** First-pass leak test yield per kit revision; drawn by `first-pass-chart-drawing.tsx`. */
export const FirstPassChart = lazyChart(() => import('./first-pass-chart-drawing').then((m) => m.FirstPassChart))
