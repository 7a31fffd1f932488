import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

/*
 * Text people typed reaches HTML one way: shared/text/markdown.ts (escaping, link and image
 * allow-lists), shown in the client only by web/components/markdown.tsx. A second markdown-it setup
 * or another raw-HTML sink would bypass those checks.
 */

const root = path.resolve(import.meta.dirname, '../../..');
const sourceFolders = ['api', 'web', 'shared'];
const skipped = new Set(['node_modules', 'dist', '.data']);

/** Files allowed to do what the rules below forbid elsewhere, each with its reason. */
const markdownItAllowed = new Set(['shared/text/markdown.ts']);
const rawHtmlAllowed = new Set([
  // Sets the renderer's output, which is escaped and allow-listed.
  'web/components/markdown.tsx',
]);

const importsMarkdownIt =
  /(?:\bfrom\s*|\bimport\s*\(?\s*|\brequire\s*\(\s*)['"]markdown-it(?:-container)?(?:\/[^'"]*)?['"]/;
const setsRawHtml = /dangerouslySetInnerHTML|\.innerHTML\s*=|\.outerHTML\s*=|insertAdjacentHTML/;

function sourceFiles(folder: string): string[] {
  return readdirSync(path.join(root, folder), { withFileTypes: true }).flatMap((entry) => {
    const relative = `${folder}/${entry.name}`;
    if (entry.isDirectory()) return skipped.has(entry.name) ? [] : sourceFiles(relative);
    return /\.(?:[cm]?[jt]sx?)$/.test(entry.name) ? [relative] : [];
  });
}

const files = sourceFolders.flatMap(sourceFiles).map((file) => ({
  file,
  text: readFileSync(path.join(root, file), 'utf8'),
}));

describe('one Markdown path', () => {
  it('reads the source it guards', () => {
    expect(files.length).toBeGreaterThan(100);
    expect(files.find((f) => f.file === 'shared/text/markdown.ts')?.text).toMatch(importsMarkdownIt);
    expect(files.find((f) => f.file === 'web/components/markdown.tsx')?.text).toMatch(setsRawHtml);
  });

  it('imports markdown-it and its plugins only in shared/text/markdown.ts', () => {
    const offenders = files
      .filter(({ file, text }) => !markdownItAllowed.has(file) && importsMarkdownIt.test(text))
      .map(({ file }) => file);

    expect(offenders).toEqual([]);
  });

  it('sets raw HTML only in web/components/markdown.tsx', () => {
    const offenders = files
      .filter(({ file, text }) => !rawHtmlAllowed.has(file) && setsRawHtml.test(text))
      .map(({ file }) => file);

    expect(offenders).toEqual([]);
  });

  it('would catch an import or a raw-HTML sink', () => {
    expect(importsMarkdownIt.test("import MarkdownIt from 'markdown-it';")).toBe(true);
    expect(importsMarkdownIt.test('const c = await import("markdown-it-container");')).toBe(true);
    expect(importsMarkdownIt.test("const m = require('markdown-it/dist/markdown-it.cjs.js');")).toBe(true);
    expect(setsRawHtml.test('<div dangerouslySetInnerHTML={{ __html: text }} />')).toBe(true);
    expect(setsRawHtml.test('element.innerHTML = text;')).toBe(true);
  });
});
