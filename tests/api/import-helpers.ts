// Builders for import tests: workbooks and hostile files generated in the test (nothing binary committed).
import { deflateRawSync } from 'node:zlib'
import ExcelJS from 'exceljs'
import { Client, count } from './helpers'

export async function workbook(build: (wb: ExcelJS.Workbook) => void): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  build(wb)
  return Buffer.from(await wb.xlsx.writeBuffer())
}

export function upload(client: Client, org: string, name: string, data: Buffer | string, type = 'application/octet-stream') {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(typeof data === 'string' ? Buffer.from(data) : data)], { type }), name)
  return client.post<{ id: string; statusMessage: string; sheets: { name: string }[] }>(`/api/orgs/${org}/imports`, form)
}

/** Rows that an import may create or leave behind: compare before and after. */
export async function footprint() {
  return {
    imports: await count('SELECT 1 FROM imports'),
    tables: await count('SELECT 1 FROM rate_tables'),
    versions: await count('SELECT 1 FROM table_versions'),
  }
}

// crc-32 (ISO 3309 / ITU-T V.42 polynomial 0xEDB88320), for writing zip entries by hand
const CRC = Array.from({ length: 256 }, (_, n) => { let c = n; for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1; return c >>> 0 })
function crc32(buf: Buffer) { let c = 0xffffffff; for (const b of buf) c = CRC[(c ^ b) & 0xff]! ^ (c >>> 8); return (c ^ 0xffffffff) >>> 0 }

/** A zip (PKWARE APPNOTE 4.3) of deflated entries; declared sizes can be overridden to lie. */
export function zip(entries: { name: string; data: Buffer; declaredSize?: number }[]): Buffer {
  const locals: Buffer[] = []
  const centrals: Buffer[] = []
  let offset = 0
  for (const e of entries) {
    const body = deflateRawSync(e.data, { level: 9 })
    const name = Buffer.from(e.name)
    const size = e.declaredSize ?? e.data.length
    const local = Buffer.alloc(30)
    local.writeUInt32LE(0x04034b50, 0); local.writeUInt16LE(20, 4); local.writeUInt16LE(8, 8)
    local.writeUInt32LE(crc32(e.data), 14); local.writeUInt32LE(body.length, 18); local.writeUInt32LE(size, 22); local.writeUInt16LE(name.length, 26)
    const central = Buffer.alloc(46)
    central.writeUInt32LE(0x02014b50, 0); central.writeUInt16LE(20, 4); central.writeUInt16LE(20, 6); central.writeUInt16LE(8, 10)
    central.writeUInt32LE(crc32(e.data), 16); central.writeUInt32LE(body.length, 20); central.writeUInt32LE(size, 24); central.writeUInt16LE(name.length, 28)
    central.writeUInt32LE(offset, 42)
    locals.push(local, name, body)
    centrals.push(central, name)
    offset += local.length + name.length + body.length
  }
  const cd = Buffer.concat(centrals)
  const end = Buffer.alloc(22)
  end.writeUInt32LE(0x06054b50, 0); end.writeUInt16LE(entries.length, 8); end.writeUInt16LE(entries.length, 10)
  end.writeUInt32LE(cd.length, 12); end.writeUInt32LE(offset, 16)
  return Buffer.concat([...locals, cd, end])
}

export const MINIMAL_PARTS = {
  '[Content_Types].xml': '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="xml" ContentType="application/xml"/></Types>',
  'xl/workbook.xml': '<?xml version="1.0" encoding="UTF-8"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheets><sheet name="S" sheetId="1"/></sheets></workbook>',
}
