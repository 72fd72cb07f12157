import { spawnSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { writeSignedWorkbook } from '~~/server/lib/signing'
import { extractForOpenssl } from '~~/scripts/verify-export'
import { arbitraryContent, headOf, signatureOf, testKey } from './fixtures'

// Outside reference: the OpenSSL command-line tool (pkeyutl with Ed25519, dgst -sha256) checks what the
// offline script extracts from a workbook, exactly as docs/verify-offline.md tells an auditor to.
describe('signed export checked by openssl', () => {
  const key = testKey()
  const content = fc.sample(arbitraryContent(key.kid), { numRuns: 1, seed: 42 })[0]!

  it('openssl pkeyutl verifies the signature over the content stored in the workbook, and refuses a changed byte', async () => {
    const file = await writeSignedWorkbook(content, signatureOf(content, key), headOf(key))
    const parts = await extractForOpenssl(file, key.x)
    const dir = mkdtempSync(path.join(tmpdir(), 'kw-openssl-'))
    const at = (f: string) => path.join(dir, f)
    writeFileSync(at('content.json'), parts.content)
    writeFileSync(at('sig.bin'), parts.signature)
    writeFileSync(at('pub.pem'), parts.pem)
    const run = (input: string) => spawnSync('openssl', ['pkeyutl', '-verify', '-pubin', '-inkey', at('pub.pem'), '-rawin', '-in', at(input), '-sigfile', at('sig.bin')], { encoding: 'utf8' })
    const ok = run('content.json')
    expect(ok.stdout + ok.stderr).toContain('Signature Verified Successfully')
    expect(ok.status).toBe(0)
    const changed = Buffer.from(parts.content)
    changed[changed.length - 2] ^= 1
    writeFileSync(at('changed.json'), changed)
    expect(run('changed.json').status).not.toBe(0)
    const digest = spawnSync('openssl', ['dgst', '-sha256', '-r', at('content.json')], { encoding: 'utf8' })
    expect(digest.stdout.split(' ')[0]).toBe(parts.sha256)
  })
})
