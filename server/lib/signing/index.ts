// Signing and verification core for exported tables: pure Node (crypto, exceljs), no framework.
export * from './content'
export * from './keys'
export * from './escape'
export { workbookModel, SHEET, CAUTION, type CellValue, type SheetModel } from './workbook-model'
export { writeSignedWorkbook, readWorkbookCells, contentFromSheets, type SheetCells } from './workbook-io'
export { verifyWorkbookCells, signatureSheetField, diffCells, cellAddress, columnName, MAX_DIFFERENCES, type Verdict, type CellDifference } from './verify'
