import { HttpError } from '../../errors'
import type { CsvLineError } from '../../../shared/schemas/signals'

/**
 * A CSV import refused as a whole (nothing stored). `lines` is the per-line report; `issues`
 * carries the same problems as paths ['line', n, column] for clients that show issues generically.
 */
export class CsvInvalid extends HttpError {
  constructor(readonly lines: CsvLineError[]) {
    super(422, 'csv_invalid', `The file has ${lines.length} problem${lines.length === 1 ? '' : 's'}; nothing was imported.`, {
      lines,
      issues: lines.map((l) => ({ path: ['line', l.line, l.column], message: l.message })),
    })
  }
}

export const sortLineErrors = (errors: CsvLineError[]) => [...errors].sort((a, b) => a.line - b.line)
