import { queryOptions } from '@tanstack/react-query'
import { ConnectTabletSchema } from '@kitwright/shared/tablets'
import { apiFetch } from '../../../lib/api-client'

export const tabletKeys = {
  all: ['tablets'] as const,
  connect: () => [...tabletKeys.all, 'connect'] as const,
}

/** What "Connect a tablet" shows: the address for tablets, what stops them, the local authority. */
export function connectTabletOptions() {
  return queryOptions({
    queryKey: tabletKeys.connect(),
    queryFn: ({ signal }) => apiFetch('/tablets/connect', ConnectTabletSchema, { signal }),
  })
}

/** The QR codes are SVG images drawn by the server, from the same address as the page shows. */
export const tabletQrImages = {
  signIn: '/api/tablets/sign-in-qr.svg',
  caCertificate: '/api/tablets/ca-certificate-qr.svg',
} as const
