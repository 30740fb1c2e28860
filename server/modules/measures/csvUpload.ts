import type { RequestHandler } from 'express'
import multer from 'multer'
import { HttpError } from '../../middleware/HttpError'

/** A CSV of a course's earlier scores is a few hundred bytes; 64 kB leaves room for 500 rows and refuses anything else. */
export const MAX_CSV_BYTES = 64 * 1024

const csvTypes = new Set(['text/csv', 'application/vnd.ms-excel', 'application/csv'])
const looksLikeCsv = (file: Express.Multer.File) =>
  csvTypes.has(file.mimetype) || (file.mimetype === 'text/plain' && /\.csv$/i.test(file.originalname))

const notCsv = () => new HttpError(415, 'unsupported_type', 'Choose a .csv file (comma-separated text).')

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_CSV_BYTES, files: 1, fields: 5, parts: 6 },
  fileFilter: (_req, file, done) => (looksLikeCsv(file) ? done(null, true) : done(notCsv())),
}).single('file')

/**
 * Reads one multipart field `file` into memory with size and type limits, and answers in the one error shape:
 * 413 too big, 415 not a CSV, 400 when there is no file. Leaves the text on `req.csvText`.
 */
export const csvUpload: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `That file is too large; the most is ${MAX_CSV_BYTES / 1024} kB.`))
      return next(new HttpError(400, 'bad_upload', 'Send one CSV file in the field "file".'))
    }
    if (err) return next(err)
    const file = req.file
    if (!file) return next(new HttpError(400, 'no_file', 'Choose a CSV file to upload.'))
    // A spreadsheet saved in its own binary format is not text, whatever its name says.
    if (file.buffer.includes(0)) return next(notCsv())
    const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer)
    Object.defineProperty(req, 'csvText', { value: text, configurable: true })
    next()
  })
}

export const csvTextOf = (req: Express.Request): string => (req as unknown as { csvText: string }).csvText
