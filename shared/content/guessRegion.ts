import type { RegionCode } from './crisisLines'

// EU member states (ISO 3166-1 alpha-2) where 112 is the common emergency number; EC 112 notices.
const euCountries = new Set([
  'AT', 'BE', 'BG', 'HR', 'CY', 'CZ', 'DK', 'EE', 'FI', 'FR', 'DE', 'GR', 'HU', 'IT', 'LV', 'LT', 'LU', 'MT', 'NL',
  'PL', 'PT', 'RO', 'SK', 'SI', 'ES', 'SE',
])

const direct: Record<string, RegionCode> = {
  US: 'US', CA: 'CA', GB: 'UK', UK: 'UK', IE: 'IE', AU: 'AU', NZ: 'NZ',
}

/**
 * Guesses the Help now region from browser locales such as "en-GB" or "fr-CA".
 * Returns undefined when no locale names a supported country, so the caller can ask.
 */
export function guessRegion(locales: readonly string[]): RegionCode | undefined {
  for (const locale of locales) {
    const country = countryOf(locale)
    if (!country) continue
    if (direct[country]) return direct[country]
    if (euCountries.has(country)) return 'EU'
  }
  return undefined
}

function countryOf(locale: string): string | undefined {
  try {
    return new Intl.Locale(locale).maximize().region?.toUpperCase()
  } catch {
    return undefined
  }
}
