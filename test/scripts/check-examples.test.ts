import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  compareOutput,
  defaultFiles,
  normalise,
  parseExamples,
  PLACEHOLDER,
  rewriteOutputs,
  toServicePort,
  toShownPort,
} from '../../scripts/check-examples.js';

// The parsing and comparing half of scripts/check-examples.ts (the running half needs a service and is
// exercised by `npm run check-examples` in .ci/run). The markdown below is made up for the test.
const MD = [
  '# Title',
  '',
  '```console',
  '$ echo not marked',
  'anything',
  '```',
  '',
  '<!-- example -->',
  '```console',
  '$ KEY=$(cat data/api-key)',
  '$ curl -s http://127.0.0.1:8080/v1/health',
  '{"status":"ok"}',
  '```',
  '',
  'Some prose.',
  '',
  '<!-- example volatile: created_at updated_at /x-request-id: .*/ -->',
  '```console',
  '$ curl -s -X PUT http://127.0.0.1:8080/v1/stations/A \\',
  "    -d '{}'",
  '{"station_id":"A","created_at":"2026-12-01T22:39:31.568Z","updated_at":"2026-12-01T22:39:31.568Z","n":1}',
  'x-request-id: 3f2a',
  '$ head -2 file.csv',
  'a,b',
  '1,2',
  '```',
  '',
].join('\n');

describe('check-examples: finding the examples', () => {
  const blocks = parseExamples(MD, 'T.md');

  it('takes only blocks with the marker on the line before the fence, in order', () => {
    expect(blocks).toHaveLength(2);
    expect(blocks.map((b) => b.line)).toEqual([9, 18]);
  });

  it('splits a block into commands and the output shown under each; an empty output is allowed', () => {
    expect(blocks[0]!.steps).toEqual([
      { command: 'KEY=$(cat data/api-key)', commandLines: ['$ KEY=$(cat data/api-key)'], expected: '' },
      {
        command: 'curl -s http://127.0.0.1:8080/v1/health',
        commandLines: ['$ curl -s http://127.0.0.1:8080/v1/health'],
        expected: '{"status":"ok"}',
      },
    ]);
  });

  it('a line ending in a backslash continues the command; the volatile list has keys and /regex/ items', () => {
    const [put, head] = blocks[1]!.steps;
    expect(put!.command).toBe("curl -s -X PUT http://127.0.0.1:8080/v1/stations/A \\\n    -d '{}'");
    expect(put!.expected.split('\n')).toHaveLength(2);
    expect(head!.expected).toBe('a,b\n1,2');
    expect(blocks[1]!.volatile).toEqual(['created_at', 'updated_at', '/x-request-id: .*/']);
  });

  it('a marker without a fence after it, or a block that does not start with a command, is an error', () => {
    expect(() => parseExamples('<!-- example -->\ntext\n', 'T.md')).toThrow(
      /T.md:1: an example marker must be followed directly by a fenced block/,
    );
    expect(() => parseExamples('<!-- example -->\n```\noutput\n```\n', 'T.md')).toThrow(/must start with a command line/);
    expect(() => parseExamples('<!-- example -->\n```\n$ true\n', 'T.md')).toThrow(/not closed/);
  });
});

describe('check-examples: comparing outputs', () => {
  it('equal outputs match, trailing white space and blank lines aside', () => {
    expect(compareOutput('{"status":"ok"}', '{"status":"ok"}  \n\n', [])).toBeNull();
  });

  it('a changed value is a mismatch reported as a diff of the shown and the printed line', () => {
    const diff = compareOutput('{"zhd_m":2.1685106500593894}', '{"zhd_m":2.1685106500593895}', []);
    expect(diff).toContain('-{"zhd_m":2.1685106500593894}');
    expect(diff).toContain('+{"zhd_m":2.1685106500593895}');
  });

  it('volatile JSON keys are ignored in compact and indented JSON, whatever their value; other keys are not', () => {
    const shown = '{"created_at":"2026-12-01T22:39:31.568Z","n":1}';
    expect(compareOutput(shown, '{"created_at":"2026-12-02T10:00:00.000Z","n":1}', ['created_at'])).toBeNull();
    expect(compareOutput(shown, '{"created_at":"2026-12-02T10:00:00.000Z","n":2}', ['created_at'])).not.toBeNull();
    expect(compareOutput(shown, '{"created_at":"2026-12-02T10:00:00.000Z","n":1}', [])).not.toBeNull();
    expect(normalise('{\n  "ms": 12.5,\n  "id": null\n}', ['ms', 'id'])).toBe(`{\n  "ms": "${PLACEHOLDER}",\n  "id": "${PLACEHOLDER}"\n}`);
    // A key is matched whole: "n" does not hide "station_id" or "n_total".
    expect(normalise('{"n":1,"n_total":2}', ['n'])).toBe(`{"n":"${PLACEHOLDER}","n_total":2}`);
  });

  it('a /regex/ item hides its matches on every line', () => {
    expect(compareOutput('x-request-id: 3f2a\nok', 'x-request-id: 99\nok', ['/x-request-id: .*/'])).toBeNull();
    expect(compareOutput('took 12 ms', 'took 340 ms', ['/\\d+ ms/'])).toBeNull();
  });
});

describe('check-examples: ports and --update', () => {
  it('commands go to the service port; outputs show 8080 again', () => {
    expect(toServicePort('curl -s localhost:8080/v1/health http://127.0.0.1:8080/docs', 41234)).toBe(
      'curl -s localhost:41234/v1/health http://127.0.0.1:41234/docs',
    );
    expect(toShownPort('302 http://127.0.0.1:41234/docs', 41234)).toBe('302 http://127.0.0.1:8080/docs');
    expect(toServicePort('curl -s http://127.0.0.1:80801/', 5)).toBe('curl -s http://127.0.0.1:80801/');
  });

  it('rewriting keeps the prose and the commands and replaces only the shown outputs', () => {
    const blocks = parseExamples(MD, 'T.md');
    const rewritten = rewriteOutputs(MD, blocks, [
      ['', '{"status":"ok"}\n'],
      ['{"station_id":"A","n":2}\n', 'a,b\n3,4\n'],
    ]);
    const again = parseExamples(rewritten, 'T.md');
    expect(again[1]!.steps.map((s) => s.expected)).toEqual(['{"station_id":"A","n":2}', 'a,b\n3,4']);
    expect(again[1]!.steps[0]!.commandLines).toEqual(blocks[1]!.steps[0]!.commandLines);
    expect(rewritten.split('\n').slice(0, 16)).toEqual(MD.split('\n').slice(0, 16));
    expect(
      rewriteOutputs(
        MD,
        blocks,
        blocks.map((b) => b.steps.map((s) => s.expected)),
      ),
    ).toBe(MD);
  });
});

describe('check-examples: the repository', () => {
  it('README.md has marked examples, and every marked block of the default files parses', () => {
    for (const file of defaultFiles()) {
      const blocks = parseExamples(readFileSync(new URL(`../../${file}`, import.meta.url), 'utf8'), file);
      if (file === 'README.md') expect(blocks.length).toBeGreaterThan(10);
    }
  });
});
