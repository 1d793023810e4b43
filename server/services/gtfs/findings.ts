import type { FeedReportDto, FindingDto } from '../../../shared/schemas/gtfs'

export type Severity = FindingDto['severity']
export interface FindingInput {
  file: string
  line?: number | null
  field?: string | null
  value?: string | null
  message: string
}

const MAX_VALUE_CHARS = 120

/** Errors block the import, warnings do not. Keeps the first few of each kind and every total. */
export class Findings {
  private readonly kept: FindingDto[] = []
  private readonly kinds = new Map<string, { severity: Severity; count: number; kept: number }>()
  errorCount = 0
  warningCount = 0

  constructor(private readonly capPerKind: number) {}

  error(kind: string, f: FindingInput) { this.add(kind, 'error', f) }
  warning(kind: string, f: FindingInput) { this.add(kind, 'warning', f) }

  add(kind: string, severity: Severity, f: FindingInput) {
    let k = this.kinds.get(kind)
    if (!k) this.kinds.set(kind, (k = { severity, count: 0, kept: 0 }))
    k.count++
    if (severity === 'error') this.errorCount++
    else this.warningCount++
    if (k.kept >= this.capPerKind) return
    k.kept++
    const value = f.value == null ? null : f.value.length > MAX_VALUE_CHARS ? `${f.value.slice(0, MAX_VALUE_CHARS)}...` : f.value
    this.kept.push({ kind, severity, file: f.file, line: f.line ?? null, field: f.field ?? null, value, message: f.message })
  }

  /** For a pass that is read again from the start (see stop-times.ts). */
  checkpoint() {
    return { kept: this.kept.length, errors: this.errorCount, warnings: this.warningCount, kinds: new Map([...this.kinds].map(([k, v]) => [k, { ...v }])) }
  }
  restore(c: ReturnType<Findings['checkpoint']>) {
    this.kept.length = c.kept
    this.errorCount = c.errors
    this.warningCount = c.warnings
    this.kinds.clear()
    for (const [k, v] of c.kinds) this.kinds.set(k, v)
  }

  first(): FindingDto | undefined {
    return this.kept.find((f) => f.severity === 'error')
  }

  toReport(): FeedReportDto {
    return {
      errors: this.kept.filter((f) => f.severity === 'error'),
      warnings: this.kept.filter((f) => f.severity === 'warning'),
      errorCount: this.errorCount,
      warningCount: this.warningCount,
      kinds: [...this.kinds].map(([kind, v]) => ({ kind, ...v })),
    }
  }
}

/** "stop_times.txt line 12, field arrival_time (value '25:61:00'): message" */
export function describeFinding(f: FindingDto): string {
  const where = [f.file, f.line != null ? `line ${f.line}` : null].filter(Boolean).join(' ')
  const field = f.field ? `, field ${f.field}` : ''
  const value = f.value != null && f.value !== '' ? ` (value '${f.value}')` : ''
  return `${where}${field}${value}: ${f.message}`
}
