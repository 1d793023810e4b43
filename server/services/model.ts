// The approach model behind the API: the same shared code the calculator runs in the browser,
// with the settings it refuses turned into a 422 naming the field and the reason.
import { Unprocessable } from '../errors'
import { checkApproach, checkTimeSpace, evaluateApproach, timeSpace } from '../../shared/model'
import type { ApproachInput, ApproachResult, ConstraintViolation, TimeSpaceInput, TimeSpaceResult } from '../../shared/schemas/model'

function refuse(violations: ConstraintViolation[]): void {
  if (violations.length === 0) return
  throw new Unprocessable(
    'These settings break a constraint of the signal or the approach.',
    violations.map((v) => ({ path: v.field.split('.'), message: v.reason })),
  )
}

export function evaluateApproachRequest(input: ApproachInput): ApproachResult {
  refuse(checkApproach(input))
  return evaluateApproach(input)
}

export function timeSpaceRequest(input: TimeSpaceInput): TimeSpaceResult {
  refuse(checkTimeSpace(input))
  return timeSpace(input)
}
