import multer from 'multer'
import type { Request } from 'express'
import { BadRequest } from '../errors'

/** One CSV file in the multipart field "file", kept in memory (the formats are small). */
export const csvUpload = multer({ storage: multer.memoryStorage(), limits: { fileSize: 2 * 1024 * 1024, files: 1 } }).single('file')

export function uploadedCsvText(req: Request): string {
  if (!req.file) throw new BadRequest('Attach the CSV file in the form field "file".')
  return req.file.buffer.toString('utf8')
}

export function sendCsv(res: import('express').Response, filename: string, body: string): void {
  res.type('text/csv; charset=utf-8').attachment(filename).send(body)
}
