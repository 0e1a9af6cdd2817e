import type { ArchiveApp } from './archive-app.js';

/**
 * The campaign's progress (GET /v1/campaigns/{id}) polled every 200 ms until `done` says so; throws with
 * the last answer past the timeout.
 */
export async function waitForCampaign(t: ArchiveApp, id: string, done: (body: any) => boolean, timeoutMs = 120_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await t.api().get(`/v1/campaigns/${id}`).expect(200);
    if (done(r.body)) return r.body;
    if (Date.now() > deadline) throw new Error(`campaign ${id} still ${r.body.state}: ${JSON.stringify(r.body)}`);
    await new Promise((res) => setTimeout(res, 200));
  }
}
