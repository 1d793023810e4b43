// Metric or US customary, as the signed-in person's organisation is set: every figure a view
// shows in a length, speed or density goes through here (values stay SI everywhere else).
import { computed } from 'vue'
import { storeToRefs } from 'pinia'
import { useSessionStore } from '@/stores/session'
import { density, distance, longDistance, show, speed, type Measure, type UnitSystem } from '@shared/units/units'

export function useUnits() {
  const { user } = storeToRefs(useSessionStore())
  const system = computed<UnitSystem>(() => user.value?.organisation.unitSystem ?? 'metric')
  const text = (m: Measure | null) => (m ? show(m) : '–')
  const ok = (x: number | null | undefined): x is number => x !== null && x !== undefined && Number.isFinite(x)
  return {
    system,
    /** Labels of the units the columns of a table use. */
    longDistanceUnit: computed(() => (system.value === 'us' ? 'mi' : 'km')),
    speedUnit: computed(() => (system.value === 'us' ? 'mph' : 'km/h')),
    densityUnit: computed(() => (system.value === 'us' ? 'veh/mi' : 'veh/km')),
    distance: (m: number | null | undefined) => text(ok(m) ? distance(m, system.value) : null),
    speed: (kmh: number | null | undefined) => text(ok(kmh) ? speed(kmh, system.value) : null),
    density: (vehPerKm: number | null | undefined) => text(ok(vehPerKm) ? density(vehPerKm, system.value) : null),
    /** The number alone in the column unit (for tables and their CSV). */
    longDistanceValue: (m: number | null | undefined) => (ok(m) ? longDistance(m, system.value).value : null),
    speedValue: (kmh: number | null | undefined) => (ok(kmh) ? speed(kmh, system.value).value : null),
  }
}
