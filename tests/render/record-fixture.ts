import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { checkRecord } from '../../src/log/check-record.ts';
import type { RecordResult } from '../../src/log/result-types.ts';

/** Evaluates a record given as text, through the same path as the build, from a file in a fresh temp folder. */
export function checkRecordText(name: string, text: string): RecordResult {
  const folder = mkdtempSync(join(tmpdir(), 'groundwork-record-'));
  const path = join(folder, name.split('/').pop()!);
  writeFileSync(path, text);
  return { ...checkRecord(path, { cwd: folder }), file: name };
}

/** A record whose prose and front matter try the common script-injection vectors (OWASP XSS filter evasion cheat sheet). */
export const HOSTILE = `---
title: "<script>alert('title')</script> Trap T-9"
author: "<img src=x onerror=alert(1)>"
date: 2026-12-01
tags: [trap]
---

Plain prose with math $E = \\hbar\\omega/2$ and a [harmless link](https://example.org).

<script>window.__pwned = 'script tag'</script>
<img src="x" onerror="window.__pwned = 'onerror'">
<a href="javascript:window.__pwned='js link'">click me</a>
<div onclick="window.__pwned='onclick'" style="position:fixed">styled</div>
<iframe src="javascript:alert(1)"></iframe>
<svg><script>window.__pwned='svg script'</script></svg>
<form action="javascript:alert(1)"><input type="submit"></form>

\`\`\`variational
id: t9-ground
caption: "<b onmouseover=alert(1)>caption</b>"
potential: x^2/2
trial: exp(-a*x^2)
parameters:
  a: { start: 0.3, min: 0.01, max: 5 }
\`\`\`
`;
