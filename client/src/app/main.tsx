import { StrictMode } from 'react'
import { createRoot } from 'react-dom/client'
import { RouterProvider } from 'react-router-dom'
import '../index.css'
import { keepEarlyScans } from '../lib/early-scans'
import { AppProvider } from './provider'
import { router } from './router'

// A scan typed while a bench page is still loading waits for its scan field.
keepEarlyScans()

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>
  </StrictMode>,
)
