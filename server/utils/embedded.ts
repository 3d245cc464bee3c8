import { mkdirSync, writeFileSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import { join } from 'node:path'
import S3rver from 's3rver'
import { SMTPServer } from 'smtp-server'

// The embedded defaults: a local S3 fake and a mail catcher, started by the app
// itself when no real S3 endpoint or SMTP host is configured.

export interface EmbeddedS3 {
  endpoint: string
  close(): Promise<void>
}

export async function startEmbeddedS3(directory: string, port: number): Promise<EmbeddedS3> {
  mkdirSync(directory, { recursive: true })
  const server = new S3rver({ address: '127.0.0.1', port, directory, silent: true })
  const address = await server.run() as AddressInfo
  return {
    endpoint: `http://127.0.0.1:${address.port}`,
    close: () => server.close(),
  }
}

export interface MailCatcher {
  port: number
  directory: string
  close(): Promise<void>
}

/** Receives every message on 127.0.0.1 and keeps it as an .eml file. */
export async function startMailCatcher(directory: string, port: number): Promise<MailCatcher> {
  mkdirSync(directory, { recursive: true })
  let sequence = 0
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (chunk: Buffer) => chunks.push(chunk))
      stream.on('end', () => {
        sequence += 1
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${process.pid}-${sequence}.eml`
        writeFileSync(join(directory, name), Buffer.concat(chunks))
        callback()
      })
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => resolve())
  })
  const address = server.server.address() as AddressInfo
  return {
    port: address.port,
    directory,
    close: () => new Promise<void>(resolve => server.close(() => resolve())),
  }
}
