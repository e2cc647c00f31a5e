/** Median and 95th percentile of a list of milliseconds. */
export function percentiles(samples: number[]) {
  const sorted = [...samples].sort((a, b) => a - b)
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)]!
  return { median: at(0.5), p95: at(0.95), n: sorted.length }
}

export function report(title: string, rows: Record<string, string | number>) {
  const lines = Object.entries(rows).map(([k, v]) => `  ${k.padEnd(34)} ${v}`)
  console.log(`\n${title}\n${lines.join('\n')}\n`)
}

export async function timed<T>(work: () => Promise<T>): Promise<[number, T]> {
  const start = performance.now()
  const value = await work()
  return [performance.now() - start, value]
}

/** Rows printed as aligned columns under one title (the first row is the header). */
export function table(title: string, rows: (string | number)[][], notes: string[] = []) {
  const cells = rows.map(row => row.map(String))
  const widths = cells[0]!.map((_, column) => Math.max(...cells.map(row => (row[column] ?? '').length)))
  const lines = cells.map(row => `  ${row.map((cell, column) => (column === 0 ? cell.padEnd(widths[column]!) : cell.padStart(widths[column]!))).join('  ')}`)
  lines.splice(1, 0, `  ${widths.map(width => '-'.repeat(width)).join('  ')}`)
  console.log(`\n${title}\n${lines.join('\n')}${notes.length ? `\n${notes.map(note => `  ${note}`).join('\n')}` : ''}\n`)
}
