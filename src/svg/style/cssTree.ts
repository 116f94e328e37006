/**
 * css-tree's parser and generator, loaded on first use (their CommonJS
 * build, synchronously): a document with no `style` attribute, no sheet and
 * no CSS transform never pays their start-up (about 36 ms of module loading
 * per process and per worker thread, measured on the shared 2-core machine).
 */
import { createRequire } from 'node:module';
import type parseType from 'css-tree/parser';
import type generateType from 'css-tree/generator';

const load = createRequire(import.meta.url);
let parser: typeof parseType | null = null;
let generator: typeof generateType | null = null;

/** css-tree's `parse`. */
export const parseCss: typeof parseType = ((text: string, options?: Parameters<typeof parseType>[1]) => {
  parser ??= load('css-tree/parser') as typeof parseType;
  return parser(text, options);
}) as typeof parseType;

/** css-tree's `generate`. */
export const generateCss: typeof generateType = ((ast: Parameters<typeof generateType>[0], options?: Parameters<typeof generateType>[1]) => {
  generator ??= load('css-tree/generator') as typeof generateType;
  return generator(ast, options);
}) as typeof generateType;
