import { CreateBucketCommand, DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'

/*
 * Attachments live in an object store spoken to through the S3 API (@aws-sdk/client-s3).
 * With NUXT_S3_ENDPOINT set, that bucket (a hosted store or any S3-compatible one); without
 * it, the local stand-in the app starts (server/plugins/02.object-store.ts, s3rver under
 * data/objects), the way the mail catcher stands in for SMTP. The app is the only client:
 * every read goes through its routes and the access policy, never a link to the store.
 */

let standInEndpoint: string | null = null
let client: S3Client | null = null
let bucketReady: Promise<void> | null = null

/** Whether the local stand-in runs: only without NUXT_S3_ENDPOINT. */
export function objectStoreStandInEnabled(): boolean {
  return !useRuntimeConfig().s3Endpoint
}

/** The stand-in's address once it listens (set by the plugin). */
export function useStandInEndpoint(endpoint: string | null) {
  standInEndpoint = endpoint
  client = null
  bucketReady = null
}

function store(): { client: S3Client, bucket: string } {
  const config = useRuntimeConfig()
  const bucket = String(config.s3Bucket)
  if (!client) {
    const endpoint = String(config.s3Endpoint || standInEndpoint || '')
    if (!endpoint) throw createError({ statusCode: 503, message: 'errors.attachments.storeDown' })
    const standIn = !config.s3Endpoint
    client = new S3Client({
      endpoint,
      region: String(config.s3Region),
      forcePathStyle: standIn || String(config.s3ForcePathStyle) === 'true',
      // The stand-in takes its own fixed demo keys; a real store gets the configured ones
      // (or, when none are set, the SDK's usual chain: environment, profile, instance role).
      credentials: standIn
        ? { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }
        : config.s3AccessKeyId
          ? { accessKeyId: String(config.s3AccessKeyId), secretAccessKey: String(config.s3SecretAccessKey) }
          : undefined,
    })
  }
  return { client, bucket }
}

/** The bucket exists (created once on the stand-in; a real one must exist already). */
async function ensureBucket() {
  const { client, bucket } = store()
  bucketReady ??= client.send(new HeadBucketCommand({ Bucket: bucket })).then(
    () => undefined,
    async (error) => {
      if (!objectStoreStandInEnabled()) throw error
      await client.send(new CreateBucketCommand({ Bucket: bucket }))
    },
  ).catch((error) => {
    bucketReady = null
    throw error
  })
  await bucketReady
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
  await ensureBucket()
  const { client, bucket } = store()
  await client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType }))
}

export async function getObject(key: string): Promise<Buffer> {
  await ensureBucket()
  const { client, bucket } = store()
  const answer = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }))
  if (!answer.Body) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return Buffer.from(await answer.Body.transformToByteArray())
}

/** Removes one object (no error when it is already gone: S3 answers 204 either way). */
export async function deleteObject(key: string): Promise<void> {
  await ensureBucket()
  const { client, bucket } = store()
  await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }))
}
