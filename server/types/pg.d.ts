// pg ships no types (and @types/pg is not installed): the part of its API Tidewell uses
// (server/utils/core/db.ts, the tests' query helper and the move script).
declare module 'pg' {
  interface QueryResult<R = Record<string, unknown>> {
    rows: R[]
    rowCount: number | null
    fields: { name: string, dataTypeID: number }[]
  }
  export class Client {
    constructor(config?: string | { connectionString?: string })
    connect(): Promise<void>
    query<R = Record<string, unknown>>(text: string, values?: unknown[]): Promise<QueryResult<R>>
    end(): Promise<void>
  }
  export const types: {
    builtins: Record<string, number>
    setTypeParser: (oid: number, parse: (value: string) => unknown) => void
  }
  const pg: { Client: typeof Client, types: typeof types }
  export default pg
}
