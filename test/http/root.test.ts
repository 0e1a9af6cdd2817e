/**
 * GET / serves the built workspace page and /assets/ its files (scripts/build-web.ts), with a
 * Content-Security-Policy that allows this origin only; nothing else is served under /assets/.
 */

import { beforeAll, describe, expect, it } from 'vitest';
import { buildWeb } from '../../scripts/build-web.js';
import { PAGE_CSP } from '../../src/http/routes/root.js';
import { useApp } from '../helpers/app.js';

describe('the workspace page route', () => {
  beforeAll(async () => {
    await buildWeb();
  }, 60_000);
  const api = useApp();

  it('serves the page at / with a same-origin-only CSP', async () => {
    const res = await api().get('/').expect(200);
    expect(res.headers['content-type']).toBe('text/html; charset=utf-8');
    expect(res.headers['content-security-policy']).toBe(PAGE_CSP);
    expect(PAGE_CSP).toContain("connect-src 'self'");
    expect(PAGE_CSP).not.toMatch(/https?:/);
    expect(res.text).toContain('<script type="module" src="assets/app.js">');
    expect(res.text).toMatch(/not use them for safety-of-life decisions/);
    // Only relative references: no other host named in the page.
    expect(res.text).not.toMatch(/(src|href)="(https?:)?\/\//);
  });

  it('serves the bundled script, the stylesheet and the land outline', async () => {
    const js = await api().get('/assets/app.js').expect(200);
    expect(js.headers['content-type']).toBe('text/javascript; charset=utf-8');
    expect(js.text.length).toBeGreaterThan(10_000);
    const css = await api().get('/assets/app.css').expect(200);
    expect(css.text).toContain('.uplot'); // uPlot's stylesheet is bundled in
    const land = await api().get('/assets/land-50m.json').expect(200);
    expect(land.body.type).toBe('Topology');
  });

  it('answers 404 problem for any other asset name', async () => {
    for (const name of ['other.js', '..%2Fpackage.json', 'index.html']) {
      const res = await api().get(`/assets/${name}`).expect(404);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    }
  });
});
