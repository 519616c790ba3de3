import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { DOMParser, type Element } from '@xmldom/xmldom';
import { describe, expect, test } from 'vitest';
import { CHANNELS, TOKEN_MEANINGS } from '../solver/index';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const NOTES = join(ROOT, 'public', 'notes.html');
const html = readFileSync(NOTES, 'utf8');
const doc = new DOMParser().parseFromString(html, 'text/html');

function elements(root: { getElementsByTagName(name: string): ArrayLike<Element> }, tag = '*') {
  return Array.from(root.getElementsByTagName(tag));
}

const ids = new Set(
  elements(doc)
    .map((e) => e.getAttribute('id'))
    .filter((id) => id),
);

/** The element with id `id` (xmldom's HTML documents have no getElementById). */
function byId(id: string): Element {
  const found = elements(doc).find((e) => e.getAttribute('id') === id);
  expect(found, `#${id} in notes.html`).toBeDefined();
  return found!;
}

/** Text files of the repository that cite the notes: docs, code, tests (not dependencies). */
function sourceFiles(): string[] {
  const out = ['README.md', 'DEVELOPERS.md', 'cli.ts'].map((f) => join(ROOT, f));
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else if (/\.(ts|tsx|mjs|css|md)$/.test(name)) out.push(path);
    }
  };
  for (const dir of ['app', 'solver', 'workers', 'test', 'e2e']) walk(join(ROOT, dir));
  return out;
}

const citation = /notes\.html#([A-Za-z0-9_-]+)/g;

describe('the model notes (public/notes.html) ship with the app', () => {
  test('a self-contained page: a title, no script, nothing loaded from elsewhere', () => {
    expect(elements(doc, 'title')[0]?.textContent).toBe('Fourfold model notes');
    expect(elements(doc, 'script')).toHaveLength(0);
    for (const e of elements(doc)) {
      for (const attribute of ['src', 'href']) {
        const value = e.getAttribute(attribute) ?? '';
        expect(value, `${e.tagName} ${attribute}`).not.toMatch(/^(https?:)?\/\//);
      }
    }
    expect(html).not.toMatch(/@import|url\(/);
  });

  test('every anchor the code, the tests and the docs cite exists in the notes', () => {
    const cited: string[] = [];
    for (const file of sourceFiles()) {
      const text = readFileSync(file, 'utf8');
      for (const m of text.matchAll(citation)) {
        cited.push(m[1]!);
        expect(ids, `${relative(ROOT, file)} cites notes.html#${m[1]}`).toContain(m[1]);
      }
    }
    // The README, the app's text and the code comments cite the notes throughout.
    expect(new Set(cited).size).toBeGreaterThan(8);
    const readme = readFileSync(join(ROOT, 'README.md'), 'utf8');
    expect([...readme.matchAll(citation)].length).toBeGreaterThan(0);
  });

  test('the links inside the notes lead to headings that exist', () => {
    for (const a of elements(doc, 'a')) {
      const href = a.getAttribute('href') ?? '';
      if (href.startsWith('#')) expect(ids, `link ${href}`).toContain(href.slice(1));
    }
  });

  test('no file cites the internal design notes, which do not ship', () => {
    const self = fileURLToPath(import.meta.url);
    const designNotes = /\b(model|interfaces|product|style|toolchain)\.md\b|shared\/design/;
    for (const file of sourceFiles()) {
      if (file === self) continue;
      expect(readFileSync(file, 'utf8'), relative(ROOT, file)).not.toMatch(designNotes);
    }
  });

  test('the channel table names all 15 channels', () => {
    const names = elements(byId('channels'), 'code').map((c) => c.textContent);
    expect(new Set(names)).toEqual(new Set(CHANNELS));
  });

  test('the label table explains every symbol the solver uses, in the solver legend words', () => {
    const section = byId('labels').parentNode as Element;
    const rows = elements(section, 'tr').slice(1);
    const plain = (text: string) =>
      text
        .normalize('NFD')
        .replace(/[\u0300-\u036f]/g, '')
        .replace(/\s+/g, ' ')
        .trim();
    const table = new Map(
      rows.map((row) => {
        const [symbol, meaning] = elements(row, 'td');
        return [symbol!.textContent!.trim(), plain(meaning!.textContent!)];
      }),
    );
    expect([...table.keys()].sort()).toEqual([...Object.keys(TOKEN_MEANINGS), 'sym'].sort());
    for (const [token, meaning] of Object.entries(TOKEN_MEANINGS)) {
      expect(table.get(token), token).toBe(plain(meaning));
    }
  });
});
