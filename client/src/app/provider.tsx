import { QueryClient, QueryClientProvider } from '@tanstack/react-query'
import type { ReactNode } from 'react'
import { ApiError } from '../lib/api-client'

export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      // A 4xx will not fix itself by asking again.
      retry: (count, err) => !(err instanceof ApiError && err.status < 500) && count < 2,
      refetchOnWindowFocus: false,
      // Ask once even when the browser says it is offline: the service worker may answer from the
      // last copy it kept (client/vite.config.ts); retries then wait for the network.
      networkMode: 'offlineFirst',
    },
    // Bench actions keep themselves in the tablet's queue when the network is down (lib/offline/),
    // so a mutation always runs rather than pausing until the browser says it is online.
    mutations: { networkMode: 'always' },
  },
})

export function AppProvider({ children }: { children: ReactNode }) {
  return (
    <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
  )
}
