import { openDB, type DBSchema, type IDBPDatabase } from 'idb'

/** The benches a queued action can come from (the office has no queue). */
export type QueueBench = 'cut' | 'build' | 'pack'

/**
 * One bench action kept on the tablet until the server has it: what to send, who took it and when,
 * and what it is about (`target`, for the screens to show it as taken). `needsServer` marks what
 * only the server can decide or do (a leak test's verdict, buying a label, storing a photo): the
 * bench shows it as "waiting for the network", never as done.
 */
export interface QueuedAction {
  /** Order taken on this tablet (the store's own key). */
  seq?: number
  /** The server's key for the action (a UUID made here): sent again, it is applied once. */
  id: string
  userId: string
  bench: QueueBench
  kind: string
  /** What the person sees: "Tick step 3 of unit 1042". */
  label: string
  /** The API path (after /api) and the JSON body of the POST. */
  path: string
  body: unknown
  /** When the person took it, by this tablet's clock. */
  takenAt: string
  needsServer: boolean
  target: Record<string, string>
  state: 'waiting' | 'refused'
  /** The server's reason, for a refused action. */
  refusal?: string
  /** A photo waiting for its upload, with its type (kept here until the photo store has it). */
  photo?: Blob
}

interface OfflineDb extends DBSchema {
  actions: { key: number; value: QueuedAction; indexes: { byId: string } }
}

let opening: Promise<IDBPDatabase<OfflineDb>> | null = null

function db(): Promise<IDBPDatabase<OfflineDb>> {
  opening ??= openDB<OfflineDb>('kitwright-offline', 1, {
    upgrade(database) {
      const store = database.createObjectStore('actions', { keyPath: 'seq', autoIncrement: true })
      store.createIndex('byId', 'id', { unique: true })
    },
  })
  return opening
}

/** Every kept action, oldest first. */
export async function allActions(): Promise<QueuedAction[]> {
  return (await db()).getAll('actions')
}

/** Keeps a new action; resolves with its place in the order. */
export async function addAction(action: QueuedAction): Promise<QueuedAction> {
  const seq = await (await db()).add('actions', action)
  return { ...action, seq }
}

export async function putAction(action: QueuedAction): Promise<void> {
  await (await db()).put('actions', action)
}

export async function removeAction(seq: number): Promise<void> {
  await (await db()).delete('actions', seq)
}
