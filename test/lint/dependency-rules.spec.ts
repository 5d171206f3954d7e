import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

// Proves the workspace's dependency rules are enforced by the linter, not only written down.
const eslint = new ESLint({ cwd: process.cwd() });

async function ruleHits(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.ruleId === 'no-restricted-imports').map((m) => m.message);
}

describe('dependency rules', { timeout: 120_000 }, () => {
  it('refuse a framework import in libs/calc', async () => {
    expect(
      await ruleHits(
        "import { Component } from '@angular/core';\nexport const x = Component;\n",
        'libs/calc/src/rates/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import express from 'express';\nexport const x = express;\n",
        'libs/calc/src/rates/bad.ts',
      ),
    ).toHaveLength(1);
  });

  it('refuse a Node built-in and the database in libs/calc', async () => {
    expect(
      await ruleHits(
        "import { readFileSync } from 'node:fs';\nexport const x = readFileSync;\n",
        'libs/calc/src/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { x } from '@gapwise/db';\nexport const y = x;\n",
        'libs/calc/src/bad.ts',
      ),
    ).toHaveLength(1);
  });

  it('refuse libraries importing apps and deep library imports', async () => {
    expect(
      await ruleHits(
        "import { x } from '../../../apps/api/src/app';\nexport const y = x;\n",
        'libs/contracts/src/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { x } from '@gapwise/calc/src/core/units';\nexport const y = x;\n",
        'apps/api/src/bad.ts',
      ),
    ).toHaveLength(1);
  });

  it('refuse the web app importing the API and the API importing the web app', async () => {
    expect(
      await ruleHits(
        "import { x } from '../../../api/src/app';\nexport const y = x;\n",
        'apps/web/src/app/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { x } from '../../web/src/main';\nexport const y = x;\n",
        'apps/api/src/bad.ts',
      ),
    ).toHaveLength(1);
  });

  it('refuse an app importing another app and the database layer importing an app', async () => {
    expect(
      await ruleHits(
        "import { analyzeTraces } from '../../api/src/traces/trace-analysis';\nexport const y = analyzeTraces;\n",
        'apps/cli/src/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { runTracesAnalyze } from '../../../cli/src/traces-command';\nexport const y = runTracesAnalyze;\n",
        'apps/api/src/traces/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { createPair } from '../../apps/api/src/pairs/pair-use-case';\nexport const y = createPair;\n",
        'db/seed/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { main } from '../apps/cli/src/main';\nexport const y = main;\n",
        'db/bad.ts',
      ),
    ).toHaveLength(1);
  });

  it('let libs/traces read streams and files but import no framework, app or database', async () => {
    expect(
      await ruleHits(
        "import { createGunzip } from 'node:zlib';\nexport const y = createGunzip;\n",
        'libs/traces/src/ok.ts',
      ),
    ).toEqual([]);
    expect(
      await ruleHits(
        "import express from 'express';\nexport const y = express;\n",
        'libs/traces/src/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { x } from '../../../apps/api/src/traces/trace-use-case';\nexport const y = x;\n",
        'libs/traces/src/bad.ts',
      ),
    ).toHaveLength(1);
    expect(
      await ruleHits(
        "import { readFileSync } from 'node:fs';\nexport const x = readFileSync;\n",
        'libs/contracts/src/bad.ts',
      ),
    ).toHaveLength(1);
  });

  it('allow what the rules allow', async () => {
    expect(
      await ruleHits(
        "import { calculate } from '@gapwise/calc';\nexport const y = calculate;\n",
        'apps/api/src/ok.ts',
      ),
    ).toEqual([]);
    expect(
      await ruleHits(
        "import { x } from '../core/units';\nexport const y = x;\n",
        'libs/calc/src/rates/ok.ts',
      ),
    ).toEqual([]);
    expect(
      await ruleHits(
        "import { analyzeTraces } from '@gapwise/traces';\nexport const y = analyzeTraces;\n",
        'apps/cli/src/ok.ts',
      ),
    ).toEqual([]);
  });
});
