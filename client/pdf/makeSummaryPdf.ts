import { buildSummaryPdf, type SummaryInput, type SummaryProgress } from './buildSummaryPdf'
import { loadSummaryFonts } from './loadSummaryFonts'

/** The lazily loaded entry point: fonts, then the PDF. Import it with `import()` so pdf-lib stays out of the first route. */
export async function makeSummaryPdf(input: SummaryInput, onProgress: SummaryProgress = () => {}): Promise<Uint8Array> {
  onProgress(0.02, 'Loading the fonts')
  const fonts = await loadSummaryFonts()
  return buildSummaryPdf(input, fonts, onProgress)
}

/** Hands the PDF to the browser as a download; nothing leaves the device. */
export function downloadPdf(bytes: Uint8Array, fileName: string): void {
  const url = URL.createObjectURL(new Blob([bytes as BlobPart], { type: 'application/pdf' }))
  const a = document.createElement('a')
  a.href = url
  a.download = fileName
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 60_000)
}
