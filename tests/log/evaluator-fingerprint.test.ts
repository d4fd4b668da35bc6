import { mkdirSync, mkdtempSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { evaluatorFingerprint } from '../../src/log/evaluator-fingerprint.ts';
import { TOOL_ROOT } from '../../src/log/tool-root.ts';

describe('evaluator fingerprint', () => {
  it('changes with an engine source and not with presentation code or the compiled copy', () => {
    const root = mkdtempSync(join(tmpdir(), 'groundwork-fingerprint-'));
    for (const folder of ['src/engine', 'src/render', 'compiled/engine']) mkdirSync(join(root, folder), { recursive: true });
    writeFileSync(join(root, 'package.json'), '{}');
    symlinkSync(join(TOOL_ROOT, 'node_modules'), join(root, 'node_modules'));
    writeFileSync(join(root, 'src/engine/energy.ts'), 'export const scale = 1;\n');
    writeFileSync(join(root, 'src/render/panel.ts'), 'export const title = "a";\n');
    const first = evaluatorFingerprint(root);
    writeFileSync(join(root, 'src/render/panel.ts'), 'export const title = "b";\n');
    writeFileSync(join(root, 'compiled/engine/energy.js'), 'export const scale = 3;\n');
    expect(evaluatorFingerprint(root)).toBe(first);
    writeFileSync(join(root, 'src/engine/energy.ts'), 'export const scale = 2;\n');
    expect(evaluatorFingerprint(root)).not.toBe(first);
  });
});
