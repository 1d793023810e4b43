// Stops without times: GTFS Schedule leaves arrival_time and departure_time empty at stops that
// are not timepoints and expects the consumer to interpolate them. Fanlight interpolates linearly
// on the distance travelled between the nearest timed stops before and after, and falls back to
// the count of stops between them when distances are missing or do not increase.

/**
 * Fills NaN entries of `arr` and `dep` in place; a stop with one of the two times gets the other
 * one copied. Returns, per stop, whether both times were interpolated. The first and the last
 * stop must carry a time (the caller reports it otherwise); stops outside timed ones stay NaN.
 */
export function interpolateStopTimes(arr: Float64Array | number[], dep: Float64Array | number[], distM: ArrayLike<number> | null): boolean[] {
  const n = arr.length
  const interpolated = new Array<boolean>(n).fill(false)
  for (let i = 0; i < n; i++) {
    if (Number.isNaN(arr[i]) && !Number.isNaN(dep[i])) arr[i] = dep[i]
    else if (Number.isNaN(dep[i]) && !Number.isNaN(arr[i])) dep[i] = arr[i]
  }
  let prev = -1
  for (let i = 0; i < n; i++) {
    if (!Number.isNaN(arr[i])) { prev = i; continue }
    if (prev < 0) continue
    let next = i + 1
    while (next < n && Number.isNaN(arr[next])) next++
    if (next >= n) break
    const t0 = dep[prev], t1 = arr[next]
    const useDist = distM !== null && distM[next] > distM[prev] &&
      (() => { for (let k = prev + 1; k <= next; k++) if (!(distM[k] >= distM[k - 1])) return false; return true })()
    for (let k = i; k < next; k++) {
      const f = useDist ? (distM![k] - distM![prev]) / (distM![next] - distM![prev]) : (k - prev) / (next - prev)
      arr[k] = dep[k] = Math.round(t0 + f * (t1 - t0))
      interpolated[k] = true
    }
    prev = next
    i = next
  }
  return interpolated
}
