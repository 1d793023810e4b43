import type { User } from 'lucia'
import { Forbidden } from '../../errors'
import { mayEditSignal } from '../../../shared/signals/permissions'

/** Data-dependent check behind requireRole: only that city's engineers (and admins) keep its signals. */
export function assertMayEditSignal(actor: User, jurisdictionId: string, what = 'this intersection'): void {
  if (!mayEditSignal(actor, jurisdictionId)) {
    throw new Forbidden(`Only traffic engineers of the city that owns ${what} may change it.`)
  }
}
