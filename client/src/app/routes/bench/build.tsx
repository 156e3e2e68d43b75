import { BenchNotReady } from '../../../components/layout/bench-not-ready'

export function Component() {
  return <BenchNotReady bench="Build bench" what="scan a bin, tick each build step, photograph the unit and record its leak test" />
}
