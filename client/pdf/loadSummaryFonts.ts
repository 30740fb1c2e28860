// Emitted as files by Vite and precached by the service worker (woff is in globPatterns), so the PDF builds offline.
import boldExtUrl from '@fontsource/lora/files/lora-latin-ext-700-normal.woff?url'
import boldLatinUrl from '@fontsource/lora/files/lora-latin-700-normal.woff?url'
import regularExtUrl from '@fontsource/lora/files/lora-latin-ext-400-normal.woff?url'
import regularLatinUrl from '@fontsource/lora/files/lora-latin-400-normal.woff?url'
import type { SummaryFontBytes } from './buildSummaryPdf'

async function bytesOf(url: string): Promise<Uint8Array> {
  const res = await fetch(url)
  if (!res.ok) throw new Error(`The PDF font could not be loaded (${res.status}). Open Rungs once online, then try again.`)
  return new Uint8Array(await res.arrayBuffer())
}

/** The Lora .woff files the summary embeds (woff, not woff2: fontkit hangs subsetting woff2). */
export async function loadSummaryFonts(): Promise<SummaryFontBytes> {
  const [rl, re, bl, be] = await Promise.all([regularLatinUrl, regularExtUrl, boldLatinUrl, boldExtUrl].map(bytesOf))
  return { regular: { latin: rl!, ext: re! }, bold: { latin: bl!, ext: be! } }
}
