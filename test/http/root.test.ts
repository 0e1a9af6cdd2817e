import { describe, expect, it } from 'vitest';
import { useApp } from '../helpers/app.js';

// GET / is where a person lands who opens the service's address in a browser (README, Set-up): it must
// lead to the interactive documentation, not to a 404. Status and Location: RFC 9110 §15.4.3 (302 Found).
describe('GET / (start page)', () => {
  const api = useApp();

  it('redirects with 302 to /docs, without a body', async () => {
    const res = await api().get('/').redirects(0);
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe('/docs');
    expect(res.text ?? '').toBe('');
  });

  it('following the redirect reaches the interactive documentation (an HTML page)', async () => {
    const res = await api().get('/').redirects(3);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/html/);
    expect(res.text).toContain('<html');
  });

  it('is listed in the OpenAPI document with its 302 answer', async () => {
    const doc = await api().get('/openapi.json').expect(200);
    expect(Object.keys(doc.body.paths['/'].get.responses)).toEqual(['302']);
  });

  it('answers only GET (and HEAD): POST / is a 404 problem', async () => {
    const res = await api().post('/').send({});
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  });
});
