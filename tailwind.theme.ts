import plugin from 'tailwindcss/plugin'

// Light and dark for the whole app without a `dark:` class on every element. The neutrals (paper, ink) are CSS
// variables that swap; the accents keep their values for solid surfaces (buttons, the header) while their text shades
// turn light and their tints turn deep in dark. Dark follows the system (prefers-color-scheme) unless <html> carries
// `light` or `dark` (the switch in the user menu, plugins/theme.ts). Print is always light.

const hex = (h: string) => [1, 3, 5].map(i => Number.parseInt(h.slice(i, i + 2), 16)).join(' ')

export const NEUTRALS = {
  light: {
    'paper': '#f7f5f0', 'paper-raised': '#fffdf9', 'paper-sunk': '#efebe3', 'paper-line': '#dcd6ca',
    'ink-900': '#1b2229', 'ink-800': '#27313b', 'ink-700': '#3a4651', 'ink-600': '#52606c', 'ink-500': '#5d6974',
    'ink-400': '#8e99a3', 'ink-300': '#b4bcc3', 'ink-200': '#d5dade', 'ink-100': '#eceff1',
  },
  dark: {
    'paper': '#13181d', 'paper-raised': '#1a2127', 'paper-sunk': '#0f1317', 'paper-line': '#34404a',
    'ink-900': '#eef1f3', 'ink-800': '#e0e5e9', 'ink-700': '#cbd2d8', 'ink-600': '#b0bac3', 'ink-500': '#98a3ad',
    'ink-400': '#7a8691', 'ink-300': '#56636f', 'ink-200': '#3a4651', 'ink-100': '#242d36',
  },
}

/** A colour the neutrals' variables stand for, with Tailwind's opacity modifier. */
export const neutral = (name: string) => `rgb(var(--kw-${name}) / <alpha-value>)`

// accents in dark: text shades become light, tints become deep
const DARK_TEXT: Record<string, string> = { lichen: '#9fd0c8', ochre: '#e8b96a', brick: '#f0a096', fern: '#a3d69e', plum: '#cfb0dd' }
const DARK_TINT: Record<string, [string, string, string]> = {
  lichen: ['#15292a', '#1a3532', '#24504b'], ochre: ['#2c2312', '#3a2c14', '#5a4420'], brick: ['#301714', '#3d1c18', '#5e2a24'],
  fern: ['#172a1a', '#1c3320', '#2b4d2a'], plum: ['#261d2c', '#2e2336', '#47384f'],
}

function darkRules(): Record<string, Record<string, string>> {
  const rules: Record<string, Record<string, string>> = {}
  for (const [hue, light] of Object.entries(DARK_TEXT)) {
    for (const stop of [600, 700, 800, 900]) rules[`.text-${hue}-${stop}`] = { color: light }
    const [t50, t100, t200] = DARK_TINT[hue]!
    rules[`.bg-${hue}-50`] = { 'background-color': t50 }
    rules[`.bg-${hue}-100`] = { 'background-color': t100 }
    rules[`.bg-${hue}-200`] = { 'background-color': t200 }
    rules[`.border-${hue}-200`] = { 'border-color': t200 }
    rules[`.border-${hue}-100`] = { 'border-color': t100 }
  }
  rules['.bg-white'] = { 'background-color': NEUTRALS.dark['paper-raised'] }
  rules['.bg-ink-900\\/40'] = { 'background-color': 'rgb(0 0 0 / 0.6)' }
  return rules
}

const vars = (set: Record<string, string>) => Object.fromEntries(Object.entries(set).map(([k, v]) => [`--kw-${k}`, hex(v)]))

export const themePlugin = plugin(({ addBase }) => {
  const dark = { ...vars(NEUTRALS.dark), 'color-scheme': 'dark' }
  const scoped = (prefix: string) => Object.fromEntries(Object.entries(darkRules()).map(([sel, decl]) => [`${prefix} ${sel}`, decl]))
  addBase({
    ':root': { ...vars(NEUTRALS.light), 'color-scheme': 'light' },
    '@media screen': { 'html.dark': dark, ...scoped('html.dark') },
    '@media screen and (prefers-color-scheme: dark)': { 'html:not(.light)': dark, ...scoped('html:not(.light)') },
  })
})
