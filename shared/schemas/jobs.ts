import { z } from 'zod'

export const JOB_STATES = ['queued', 'running', 'succeeded', 'failed'] as const
export type JobState = (typeof JOB_STATES)[number]

export const jobDto = z.object({
  id: z.string(),
  kind: z.string(),
  state: z.enum(JOB_STATES),
  progress: z.number().min(0).max(1),
  stage: z.string(),
  message: z.string(),
  result: z.unknown(),
})
export type JobDto = z.infer<typeof jobDto>
