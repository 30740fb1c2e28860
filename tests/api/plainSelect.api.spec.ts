import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { plainSelect } from '../../server/db/plainSelect'
import { makeTestApp, type TestApp } from '../helpers/testApp'

let t: TestApp
beforeAll(async () => {
  t = await makeTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('plainSelect', () => {
  it('answers many simultaneous reads of one statement, each with its own parameters', async () => {
    const values = Array.from({ length: 40 }, (_, i) => i)
    const rows = await Promise.all(values.map((i) => plainSelect<{ v: number }>(t.deps.sequelize, 'SELECT ? + 1 AS "v"', [i])))
    expect(rows.map((r) => r[0]!.v)).toEqual(values.map((i) => i + 1))
  })

  it('sees a row written through Sequelize after the statement was first run', async () => {
    const sql = 'SELECT COUNT(*) AS "n" FROM "users" WHERE "email" = ?'
    const email = 'plain.select.check@example.org'
    // SQLite answers COUNT as a number, PostgreSQL as a bigint in a string.
    const [before] = await plainSelect<{ n: number | string }>(t.deps.sequelize, sql, [email])
    await t.deps.models.User.create({ email, role: 'person', displayName: 'Pella Sorn', passwordHash: 'x' } as never)
    const [after] = await plainSelect<{ n: number | string }>(t.deps.sequelize, sql, [email])
    expect([Number(before!.n), Number(after!.n)]).toEqual([0, 1])
  })

  it('rejects a bad statement, and the next good one still answers', async () => {
    await expect(plainSelect(t.deps.sequelize, 'SELECT "nope" FROM "no_such_table"', [])).rejects.toThrow(/no_such_table/)
    const [row] = await plainSelect<{ v: number }>(t.deps.sequelize, 'SELECT 7 AS "v"', [])
    expect(row!.v).toBe(7)
  })

  it('lets the database close while statements it prepared are kept for reuse', async () => {
    const other = await makeTestApp()
    await Promise.all([1, 2, 3].map((i) => plainSelect(other.deps.sequelize, 'SELECT ? AS "v"', [i])))
    await expect(other.close()).resolves.toBeUndefined()
  })
})
