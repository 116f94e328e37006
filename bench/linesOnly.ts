/**
 * The lines-only baseline of the end-to-end benchmark, built from
 * general-purpose libraries: fast-xml-parser reads the document and writes it
 * back (XMLParser / XMLBuilder), simplify-js thins every polyline within the
 * tolerance (Ramer–Douglas–Peucker, high-quality mode), and the new `d` is a
 * plain string. It handles the benchmark's own file (paths of absolute
 * `M x y L x y … Z` polylines in mm), nothing more.
 * Run: npx tsx bench/linesOnly.ts <in.svg> <out.svg> <tolerance mm>
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { XMLBuilder, XMLParser } from 'fast-xml-parser';
import simplify from 'simplify-js';

type Node = Record<string, unknown>;

/** Thin one path's polylines. */
function thinD(d: string, tol: number): string {
  const out: string[] = [];
  for (const sub of d.split('M')) {
    if (!sub.trim()) continue;
    const closed = /Z\s*$/i.test(sub);
    const nums = sub.replace(/[LZ]/gi, ' ').trim().split(/[\s,]+/).map(Number);
    const pts: { x: number; y: number }[] = [];
    for (let i = 0; i + 1 < nums.length; i += 2) pts.push({ x: nums[i], y: nums[i + 1] });
    if (closed) pts.push(pts[0]);
    const kept = simplify(pts, tol, true);
    if (closed) kept.pop();
    out.push(`M${kept.map((p) => `${+p.x.toFixed(4)} ${+p.y.toFixed(4)}`).join('L')}${closed ? 'Z' : ''}`);
  }
  return out.join('');
}

function walk(node: unknown, tol: number): void {
  if (Array.isArray(node)) {
    for (const n of node) walk(n, tol);
    return;
  }
  if (!node || typeof node !== 'object') return;
  const o = node as Node;
  if (typeof o['@_d'] === 'string') o['@_d'] = thinD(o['@_d'] as string, tol);
  for (const k of Object.keys(o)) if (!k.startsWith('@_')) walk(o[k], tol);
}

/** Refit `text` lines-only at `tol` mm. */
export function linesOnly(text: string, tol: number): string {
  const opts = { ignoreAttributes: false, attributeNamePrefix: '@_', preserveOrder: true, parseAttributeValue: false, parseTagValue: false };
  const doc = new XMLParser(opts).parse(text) as unknown;
  walk(doc, tol);
  return new XMLBuilder({ ...opts, suppressEmptyNode: true }).build(doc) as string;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const [input, output, tol] = process.argv.slice(2);
  writeFileSync(output, linesOnly(readFileSync(input, 'utf8'), Number(tol)));
}
