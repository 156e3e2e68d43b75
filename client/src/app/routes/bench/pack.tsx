import { BenchNotReady } from '../../../components/layout/bench-not-ready'

export function Component() {
  return <BenchNotReady bench="Pack bench" what="scan a bin, check the contents, print the packing slip and label, and ship" />
}
