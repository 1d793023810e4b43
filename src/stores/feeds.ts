import { defineStore } from 'pinia'
import { ref } from 'vue'
import * as feedsApi from '@/api/feeds'
import type { FeedDetailDto, FeedSummaryDto } from '@shared/schemas/gtfs'

export interface FeedUploadState {
  busy: boolean
  progress: number
  stage: string
  feedId: number | null
  /** Set when the import failed: the job's message (file, line, field of the first error). */
  failure: string
}

const idle = (): FeedUploadState => ({ busy: false, progress: 0, stage: '', feedId: null, failure: '' })
const wait = (ms: number) => new Promise((r) => setTimeout(r, ms))

// Feed versions of the Feeds pages, and the upload followed through its import job.
export const useFeedsStore = defineStore('feeds', () => {
  const items = ref<FeedSummaryDto[]>([])
  const current = ref<FeedDetailDto | null>(null)
  const loading = ref(false)
  const upload = ref<FeedUploadState>(idle())

  async function load() {
    loading.value = true
    try {
      items.value = await feedsApi.listFeeds()
    } finally {
      loading.value = false
    }
  }

  async function loadOne(id: number) {
    loading.value = true
    try {
      current.value = null
      current.value = await feedsApi.getFeed(id)
    } finally {
      loading.value = false
    }
  }

  /** Uploads the zip and polls the import job until it ends; resolves with the feed id. */
  async function uploadFile(file: File): Promise<number> {
    upload.value = { ...idle(), busy: true, stage: 'uploading' }
    try {
      const { feedId, jobId } = await feedsApi.uploadFeed(file)
      upload.value.feedId = feedId
      for (;;) {
        const job = await feedsApi.getImportJob(jobId)
        upload.value = { ...upload.value, progress: job.progress, stage: job.stage }
        if (job.state === 'succeeded') break
        if (job.state === 'failed') {
          upload.value.failure = job.message || 'The import failed.'
          break
        }
        await wait(500)
      }
      await load()
      return feedId
    } finally {
      upload.value.busy = false
    }
  }

  async function remove(id: number) {
    await feedsApi.deleteFeed(id)
    items.value = items.value.filter((f) => f.id !== id)
    if (current.value?.id === id) current.value = null
  }

  return { items, current, loading, upload, load, loadOne, uploadFile, remove }
})
