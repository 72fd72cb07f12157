import { QueryTypes } from 'sequelize'
import { buildSignedExport, XLSX_TYPE, type OrgRef } from '../../exports'
import { runActor } from '../runs'
import type { RunExecutor } from './index'

export interface ExportRunInput { tableId: string, number: number, origin: { requestId: string | null, ip: string | null } }

/** The signed workbook of a signed-off version, built in a worker thread; its download is audited when the run ends. */
export const executeExport: RunExecutor = async ({ run, signal }) => {
  const { tableId, number, origin } = run.input as unknown as ExportRunInput
  const [org] = await useDb().query<OrgRef>('SELECT id, slug, name FROM organisations WHERE id = :id', { replacements: { id: run.orgId }, type: QueryTypes.SELECT })
  const { fileName, data, content, anchor } = await buildSignedExport(org!, tableId, number, signal)
  return async (t) => {
    await audit(null, { orgId: run.orgId, actor: await runActor(run, t), origin, action: 'export.download', objectType: 'table_version', objectId: content.version.id,
      detail: { tableId, number, keyId: content.keyId, bytes: data.length, signedAt: content.signedAt, trailHead: anchor.statement.head?.number ?? 0 } }, t)
    return { result: JSON.stringify({ file: { name: fileName, type: XLSX_TYPE } }), bytes: data }
  }
}
