// The server's preload links for a lazy screen, from a build manifest in the shape Vite writes
// (vite.dev/guide/backend-integration: `file`, `isEntry`, `imports`, `dynamicImports`, `css`).
import { describe, expect, it } from 'vitest';
import { chunkClosure, preloadLinks, type Manifest } from '@server/ssr/pages';

const manifest: Manifest = {
  'index.html': { file: 'assets/index.js', isEntry: true, imports: ['_react.js'], css: ['assets/index.css'] },
  '_react.js': { file: 'assets/react.js' },
  '_cn.js': { file: 'assets/cn.js', imports: ['_react.js'] },
  '_button.js': { file: 'assets/button.js', imports: ['_cn.js', '_react.js'] },
  'src/routes/bar.tsx': { file: 'assets/bar.js', imports: ['_button.js', '_react.js'] },
  'src/routes/pulse.tsx': { file: 'assets/pulse.js', imports: ['_button.js'], css: ['assets/pulse.css'] },
};

describe('chunkClosure', () => {
  it('is a chunk and all it imports, each once, in import order', () => {
    expect(chunkClosure(manifest, ['src/routes/bar.tsx'])).toEqual({
      js: ['assets/bar.js', 'assets/button.js', 'assets/cn.js', 'assets/react.js'],
      css: [],
    });
  });
  it('skips keys the manifest does not have', () => {
    expect(chunkClosure(manifest, ['src/routes/nowhere.tsx'])).toEqual({ js: [], css: [] });
  });
});

describe('preloadLinks', () => {
  it("preloads the screen's chunks that the entry does not bring", () => {
    expect(preloadLinks(manifest, ['src/routes/bar.tsx'])).toBe(
      '<link rel="modulepreload" crossorigin href="/assets/bar.js">' +
        '<link rel="modulepreload" crossorigin href="/assets/button.js">' +
        '<link rel="modulepreload" crossorigin href="/assets/cn.js">',
    );
  });
  it("links a screen's own stylesheet, so it is there before the first paint", () => {
    expect(preloadLinks(manifest, ['src/routes/pulse.tsx'])).toContain('<link rel="stylesheet" crossorigin href="/assets/pulse.css">');
  });
  it('adds nothing without a manifest (development) or without a lazy screen (404)', () => {
    expect(preloadLinks(null, ['src/routes/bar.tsx'])).toBe('');
    expect(preloadLinks(manifest, [])).toBe('');
  });
});
