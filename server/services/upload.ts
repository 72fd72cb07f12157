import type { H3Event } from 'h3'
import busboy from 'busboy'
import { ImportRefused } from '../lib/import/limits'

/**
 * Reads the one file of a multipart upload, counting bytes as they arrive (Content-Length is
 * not trusted and may be absent). At the cap it stops storing and refuses with 413 at once,
 * then closes the connection.
 */
export function readUpload(event: H3Event, maxBytes: number): Promise<{ fileName: string; data: Buffer }> {
  const req = event.node.req
  const type = req.headers['content-type'] ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    return Promise.reject(new ImportRefused(415, 'Send the file as multipart/form-data (field "file").'))
  }
  return new Promise((resolve, reject) => {
    let settled = false
    let received = 0
    let bb: busboy.Busboy
    try {
      bb = busboy({ headers: req.headers, limits: { files: 1, fileSize: maxBytes, fields: 10, parts: 12, fieldSize: 1024 } })
    } catch {
      reject(new ImportRefused(400, 'The upload is not valid multipart/form-data.'))
      return
    }
    const stop = (error: Error) => {
      if (settled) return
      settled = true
      req.unpipe(bb)
      req.off('data', count)
      stopReadingBody(event) // nothing more is stored
      reject(error)
    }
    const tooBig = () => new ImportRefused(413, `The file is larger than ${Math.round(maxBytes / 1048576)} MiB; Knotwork stopped reading it.`)
    const count = (chunk: Buffer) => {
      received += chunk.length
      if (received > maxBytes + 64 * 1024) stop(tooBig()) // the whole body, multipart framing included
    }
    let file: { fileName: string; chunks: Buffer[] } | null = null
    // the file's last chunks may still be on their way through its stream when busboy closes: wait for its end
    let fileEnded: Promise<void> = Promise.resolve()
    bb.on('file', (field, stream, info) => {
      if (field !== 'file' || file) { stream.resume(); return }
      file = { fileName: (info.filename || 'upload').slice(0, 255), chunks: [] }
      const current = file
      fileEnded = new Promise(done => stream.once('end', done))
      stream.on('data', (c: Buffer) => current.chunks.push(c))
      stream.on('limit', () => stop(tooBig()))
    })
    bb.on('error', () => stop(new ImportRefused(400, 'The upload was cut short or is not valid multipart/form-data.')))
    bb.on('close', () => {
      void fileEnded.then(() => {
        if (settled) return
        settled = true
        if (!file) reject(new ImportRefused(400, 'Choose a file to upload (field "file").'))
        else resolve({ fileName: file.fileName, data: Buffer.concat(file.chunks) })
      })
    })
    req.on('data', count)
    req.on('aborted', () => stop(new ImportRefused(400, 'The upload was interrupted.')))
    req.pipe(bb)
  })
}
