/**
 * The entries and native code (src/index.ts, src/preview.ts): `import 'arcspline'`
 * and `import 'arcspline/preview'` load no native module; sharp's native code
 * loads only when a preview is rendered. Each case runs the built package
 * (dist/, built by globalSetup) in a fresh Node process, imported by its own
 * name (a package may import itself through its "exports", Node's packages
 * documentation, "Self-referencing a package using its name"), and lists the
 * shared objects the process has loaded from Node's diagnostic report
 * (`process.report.getReport().sharedObjects`, Node's report documentation).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const PROBE = `process.report.getReport().sharedObjects.filter((s) => /\\.node$|sharp|vips/i.test(s))`;

/** Run `code` (an ES module body) in a fresh node at the package root; its native modules (.node files, libvips). */
function nativeAfter(code: string): string[] {
  const out = execFileSync(process.execPath, ['--input-type=module', '-e', `${code}\nconsole.log(JSON.stringify(${PROBE}));`], {
    cwd: ROOT, encoding: 'utf8', env: { ...process.env, NODE_OPTIONS: '' },
  });
  return JSON.parse(out.trim().split('\n').pop()!) as string[];
}

const SVG = '<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="20mm" viewBox="0 0 20 20"><path d="M2 2L18 18"/></svg>';

describe('native code and the entries', () => {
  it("import 'arcspline' loads no native module (and its functions run without one)", () => {
    const code = `const a = await import('arcspline');
      a.refitSvg(${JSON.stringify(SVG)});
      if ('renderPreview' in a) throw new Error('renderPreview belongs to arcspline/preview');`;
    expect(nativeAfter(code)).toEqual([]);
  });

  it("import 'arcspline/preview' loads none until a picture is rendered, then sharp's", () => {
    expect(nativeAfter(`await import('arcspline/preview');`)).toEqual([]);
    // The same probe sees sharp once it is loaded: it would catch an import of sharp at the top of an entry.
    const drawn = nativeAfter(`const p = await import('arcspline/preview');
      const png = await p.renderPreview(${JSON.stringify(SVG)}, ${JSON.stringify(SVG)});
      if (png.readUInt32BE(0) !== 0x89504e47) throw new Error('not a PNG');`);
    expect(drawn.some((s) => /sharp.*\.node$/.test(s))).toBe(true);
  });

  it('package.json exports both entries from the build', () => {
    const pkg = JSON.parse(readFileSync(`${ROOT}package.json`, 'utf8'));
    expect(pkg.exports['./preview']).toEqual({ types: './dist/src/preview.d.ts', import: './dist/src/preview.js' });
    expect(pkg.exports['.'].import).toBe('./dist/src/index.js');
  });
});
