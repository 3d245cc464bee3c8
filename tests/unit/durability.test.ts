import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { sql } from 'kysely'
import { describe, expect, it } from 'vitest'
import { createDatabase } from '../../db/connect'

describe('the SQLite file keeps what the app has answered for', () => {
  it('syncs the write-ahead log at every commit (synchronous = FULL)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'shadowline-durable-'))
    const db = await createDatabase({ url: join(dir, 'test.sqlite'), dataDir: dir })
    try {
      // SQLite documents the values: 0 OFF, 1 NORMAL, 2 FULL, 3 EXTRA (sqlite.org/pragma.html#pragma_synchronous).
      const mode = await sql<{ journal_mode: string }>`pragma journal_mode`.execute(db)
      const sync = await sql<{ synchronous: number }>`pragma synchronous`.execute(db)
      expect(mode.rows[0]?.journal_mode).toBe('wal')
      expect(sync.rows[0]?.synchronous).toBe(2)
    }
    finally {
      await db.destroy()
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
