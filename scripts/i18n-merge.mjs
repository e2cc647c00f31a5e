// Merge a JSON fragment of locale strings into locales/<lang>.json and keep keys sorted.
// Usage: node scripts/i18n-merge.mjs <lang> <fragment.json> [...more fragments]
import { readFileSync, writeFileSync, existsSync } from 'node:fs'

const [lang, ...fragments] = process.argv.slice(2)
if (!lang || fragments.length === 0) {
  console.error('usage: node scripts/i18n-merge.mjs <en|es> <fragment.json>...')
  process.exit(1)
}

const isObject = v => v !== null && typeof v === 'object' && !Array.isArray(v)
const merge = (target, source) => {
  for (const [key, value] of Object.entries(source)) {
    target[key] = isObject(value) && isObject(target[key]) ? merge(target[key], value) : value
  }
  return target
}
const sortKeys = value => isObject(value)
  ? Object.fromEntries(Object.keys(value).sort().map(k => [k, sortKeys(value[k])]))
  : value

const file = new URL(`../locales/${lang}.json`, import.meta.url)
let messages = existsSync(file) ? JSON.parse(readFileSync(file, 'utf8')) : {}
for (const fragment of fragments) messages = merge(messages, JSON.parse(readFileSync(fragment, 'utf8')))
writeFileSync(file, JSON.stringify(sortKeys(messages), null, 2) + '\n')
