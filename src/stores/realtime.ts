import { defineStore } from 'pinia'
import { ref } from 'vue'
import * as realtimeApi from '@/api/realtime'
import type {
  CalibrationDto, LatenessDto, RealtimeFileResultDto, RealtimeIngestSummaryDto, RealtimeSourceBody, RealtimeSourceDto,
} from '@shared/schemas/realtime'

export interface UploadState {
  busy: boolean
  progress: number
  stage: string
  summary: RealtimeIngestSummaryDto | null
  results: RealtimeFileResultDto[]
}

const idle = (): UploadState => ({ busy: false, progress: 0, stage: '', summary: null, results: [] })
const wait = (ms: number) => new Promise((r) => setTimeout(r, ms))

// Realtime data of the Observed page: uploads (followed to the end when they run as a job),
// polled sources, and what is derived for the chosen corridor.
export const useRealtimeStore = defineStore('realtime', () => {
  const upload = ref<UploadState>(idle())
  const sources = ref<RealtimeSourceDto[]>([])
  const demoFeedUrl = ref<string | null>(null)
  const calibration = ref<CalibrationDto | null>(null)
  const lateness = ref<LatenessDto | null>(null)

  async function uploadFiles(files: File[]) {
    upload.value = { ...idle(), busy: true, stage: 'uploading' }
    try {
      const out = await realtimeApi.uploadSnapshots(files)
      if ('summary' in out) {
        upload.value = { busy: false, progress: 1, stage: 'done', summary: out.summary, results: out.results }
        return
      }
      for (;;) {
        const job = await realtimeApi.getJob(out.jobId)
        upload.value = { ...upload.value, progress: job.progress, stage: job.stage }
        if (job.state === 'succeeded') {
          const r = job.result as { summary: RealtimeIngestSummaryDto; results: RealtimeFileResultDto[] }
          upload.value = { busy: false, progress: 1, stage: 'done', summary: r.summary, results: r.results }
          return
        }
        if (job.state === 'failed') throw new Error(job.message || 'The upload failed.')
        await wait(400)
      }
    } finally {
      upload.value.busy = false
    }
  }

  async function loadSources() {
    ;[sources.value, demoFeedUrl.value] = await Promise.all([
      realtimeApi.listSources(),
      realtimeApi.getDemoFeed().then((r) => r.url).catch(() => null),
    ])
  }
  async function addSource(body: RealtimeSourceBody) {
    sources.value = [...sources.value, await realtimeApi.createSource(body)]
  }
  async function removeSource(id: string) {
    await realtimeApi.deleteSource(id)
    sources.value = sources.value.filter((s) => s.id !== id)
  }
  async function pollNow(id: string) {
    const result = await realtimeApi.pollSource(id)
    sources.value = await realtimeApi.listSources()
    return result
  }

  async function loadCorridor(corridorId: string, range: realtimeApi.DateRange = {}, lateThresholdS?: number) {
    ;[calibration.value, lateness.value] = await Promise.all([
      realtimeApi.getCalibration(corridorId, range),
      realtimeApi.getLateness(corridorId, range, lateThresholdS),
    ])
  }

  return { upload, sources, demoFeedUrl, calibration, lateness, uploadFiles, loadSources, addSource, removeSource, pollNow, loadCorridor }
})
