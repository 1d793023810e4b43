// The URL of the local fake realtime endpoint when the server process started one (development),
// so the Observed page can offer it as a source. Set by server/index.ts only.
let url: string | null = null

export function setDemoFeedUrl(value: string | null): void {
  url = value
}

export function demoFeedUrl(): string | null {
  return url
}
