// The cell function of every exported table (PrimeVue DataTable's exportFunction): quotes are
// doubled, and text a spreadsheet would run as a formula is prefixed with an apostrophe.
export function csvCell({ data }: { data: unknown }): string {
  if (data === null || data === undefined) return ''
  const text = String(data).replace(/"/g, '""')
  return typeof data === 'string' && /^[=+\-@\t\r]/.test(text) ? `'${text}` : text
}
