import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  ListObjectsV2Command,
  NoSuchKey,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3'
import type { H3Event } from 'h3'

export interface ObjectStoreConfig {
  endpoint?: string
  region: string
  bucket: string
  accessKeyId: string
  secretAccessKey: string
  forcePathStyle: boolean
}

export interface StoredObject {
  body: Buffer
  contentType: string
}

export interface ObjectStore {
  bucket: string
  ensureBucket(): Promise<void>
  put(key: string, body: Buffer | Uint8Array, contentType: string): Promise<void>
  get(key: string): Promise<StoredObject | null>
  remove(key: string): Promise<void>
  /** Every key under a prefix (`sketches/<id>/`), for removing what a deleted row owned. */
  list(prefix: string): Promise<string[]>
}

/** A small store over any S3-compatible service: the embedded s3rver or a real one. */
export function createObjectStore(config: ObjectStoreConfig): ObjectStore {
  // The pinned SDK runs on Node 20; its notice concerns later releases only.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true'
  const client = new S3Client({
    endpoint: config.endpoint || undefined,
    region: config.region,
    forcePathStyle: config.forcePathStyle,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
  })
  const Bucket = config.bucket
  return {
    bucket: Bucket,
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }))
      }
      catch {
        await client.send(new CreateBucketCommand({ Bucket }))
      }
    },
    async put(key, body, contentType) {
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType }))
    },
    async get(key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: key }))
        const bytes = await out.Body?.transformToByteArray()
        if (!bytes) return null
        return { body: Buffer.from(bytes), contentType: out.ContentType ?? 'application/octet-stream' }
      }
      catch (error) {
        if (error instanceof NoSuchKey || (error as { name?: string }).name === 'NoSuchKey') return null
        throw error
      }
    },
    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }))
    },
    async list(prefix) {
      const keys: string[] = []
      let ContinuationToken: string | undefined
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket, Prefix: prefix, ContinuationToken }))
        for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key)
        ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined
      } while (ContinuationToken)
      return keys
    },
  }
}

let store: ObjectStore | undefined

export function setObjectStore(next: ObjectStore | undefined): void {
  store = next
}

export function useObjectStore(): ObjectStore {
  if (!store) throw createError({ status: 503, message: 'Object storage is not ready yet.' })
  return store
}

/**
 * Proxied read: the route that calls this has already checked that the user may
 * see the object, so keys never leak as public URLs.
 */
export async function sendStoredObject(event: H3Event, key: string, cache = 'private, max-age=300'): Promise<Buffer> {
  const object = await useObjectStore().get(key)
  if (!object) throw createError({ status: 404, message: 'File not found.' })
  setResponseHeader(event, 'content-type', object.contentType)
  setResponseHeader(event, 'cache-control', cache)
  setResponseHeader(event, 'x-content-type-options', 'nosniff')
  return object.body
}
