import fs from 'node:fs'
import path from 'node:path'
import { Sequelize } from 'sequelize'

/** Opens the SQLite file (creating its folder) and switches it to WAL so readers never wait on the writer. */
export async function openDatabase(file: string): Promise<Sequelize> {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(file), { recursive: true })
  const sequelize = new Sequelize({ dialect: 'sqlite', storage: file, logging: false })
  await sequelize.query('PRAGMA journal_mode = WAL;')
  await sequelize.query('PRAGMA foreign_keys = ON;')
  await sequelize.query('PRAGMA busy_timeout = 5000;')
  return sequelize
}
