import { wrap } from 'comlink'
import type { Remote } from 'comlink'
import type { LabWorkerApi } from '~/workers/lab.worker'

/** One lab worker for the component that asks; it stops when that component goes away. */
export function useLabWorker(): () => Remote<LabWorkerApi> {
  let worker: Worker | null = null
  let remote: Remote<LabWorkerApi> | null = null
  onScopeDispose(() => {
    worker?.terminate()
    worker = null
  })
  return () => {
    if (!remote) {
      worker = new Worker(new URL('../workers/lab.worker.ts', import.meta.url), { type: 'module' })
      remote = wrap<LabWorkerApi>(worker)
    }
    return remote
  }
}
