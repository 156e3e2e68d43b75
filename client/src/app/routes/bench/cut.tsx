import { BenchNotReady } from '../../../components/layout/bench-not-ready'

export function Component() {
  return <BenchNotReady bench="Cut bench" what="follow the published cut run stick by stick and fill each unit's bin" />
}
