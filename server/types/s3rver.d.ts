// s3rver 3 ships no types: the part of its API the object-store stand-in uses.
declare module 's3rver' {
  interface S3rverOptions {
    address?: string
    port?: number
    silent?: boolean
    directory: string
    configureBuckets?: { name: string }[]
  }
  export default class S3rver {
    constructor(options: S3rverOptions)
    run(): Promise<{ address: string, port: number }>
    close(): Promise<void>
  }
}
