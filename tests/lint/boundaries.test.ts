// The architecture is a lint rule: a probe file written in each forbidden direction is refused
// by ESLint with the rule that guards it, and the allowed directions pass.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../..');
// Unique per run so parallel runs and leftovers never collide; removed in `afterAll`.
const tag = `lint-probe-${process.pid}-${crypto.randomBytes(3).toString('hex')}`;

interface Probe {
  name: string;
  /** Path of the probe file, relative to the repository root. */
  file: string;
  source: string;
  /** The rule expected to refuse it, or null for a probe that must pass. */
  rule: string | null;
}

/** A function of 160 counted lines (no blank lines or comments, which the rule skips). */
function longFunction(head: string, tail: string): string {
  const lines = Array.from({ length: 158 }, (_, i) => `  total += ${i};`);
  return [head, '  let total = 0;', ...lines, `  ${tail}`, '}', ''].join('\n');
}

const probes: Probe[] = [
  {
    name: 'web imports api',
    file: `web/lib/${tag}-web-api.ts`,
    source: `import { NotFound } from '../../api/errors';\nexport const probe = NotFound;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'web imports db',
    file: `web/lib/${tag}-web-db.ts`,
    source: `import { createDataSource } from '../../db/data-source';\nexport const probe = createDataSource;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'shared imports db',
    file: `shared/units/${tag}-shared-db.ts`,
    source: `import { createDataSource } from '../../db/data-source';\nexport const probe = createDataSource;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'shared imports web',
    file: `shared/units/${tag}-shared-web.ts`,
    source: `import { cn } from '../../web/lib/cn';\nexport const probe = cn;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'shared imports node:fs',
    file: `shared/units/${tag}-shared-node-fs.ts`,
    source: `import fs from 'node:fs';\nexport const probe = fs.readFileSync;\n`,
    rule: 'no-restricted-imports',
  },
  {
    name: 'shared imports a Node built-in without the node: prefix',
    file: `shared/units/${tag}-shared-path.ts`,
    source: `import path from 'path';\nexport const probe = path.join;\n`,
    rule: 'import-x/no-nodejs-modules',
  },
  {
    name: 'shared imports React',
    file: `shared/units/${tag}-shared-react.ts`,
    source: `import { useState } from 'react';\nexport const probe = useState;\n`,
    rule: 'no-restricted-imports',
  },
  {
    name: 'shared imports TypeORM',
    file: `shared/units/${tag}-shared-typeorm.ts`,
    source: `import { DataSource } from 'typeorm';\nexport const probe = DataSource;\n`,
    rule: 'no-restricted-imports',
  },
  {
    name: 'shared reads a DOM global',
    file: `shared/units/${tag}-shared-dom.ts`,
    source: `export const probe = () => document.title;\n`,
    rule: 'no-restricted-globals',
  },
  {
    name: 'shared reads a Node global',
    file: `shared/units/${tag}-shared-process.ts`,
    source: `export const probe = () => process.env.HOME;\n`,
    rule: 'no-restricted-globals',
  },
  {
    name: 'db imports api',
    file: `db/${tag}-db-api.ts`,
    source: `import { NotFound } from '../api/errors';\nexport const probe = NotFound;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'an api feature imports another api feature',
    file: `api/sites/${tag}-api-feature.ts`,
    source: `import { createTrialsService } from '../trials/trials.service';\nexport const probe = createTrialsService;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'a web feature imports another web feature',
    file: `web/features/reports/${tag}-web-feature.ts`,
    source: `import { trialQueryOptions } from '../trials/api/get-trial';\nexport const probe = trialQueryOptions;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'web/lib imports a web feature',
    file: `web/lib/${tag}-lib-feature.ts`,
    source: `import { trialQueryOptions } from '../features/trials/api/get-trial';\nexport const probe = trialQueryOptions;\n`,
    rule: 'import-x/no-restricted-paths',
  },
  {
    name: 'two files import each other (first of the cycle)',
    file: `shared/units/${tag}-cycle-a.ts`,
    source: `import { second } from './${tag}-cycle-b';\nexport const first = () => second() + 1;\n`,
    rule: 'import-x/no-cycle',
  },
  {
    name: 'two files import each other (second of the cycle)',
    file: `shared/units/${tag}-cycle-b.ts`,
    source: `import { first } from './${tag}-cycle-a';\nexport const second = () => first() - 1;\n`,
    rule: 'import-x/no-cycle',
  },
  {
    name: 'a file name that is not kebab-case',
    file: `api/lib/LintProbe${tag.replace(/-/g, '')}.ts`,
    source: `export const probe = 1;\n`,
    rule: 'check-file/filename-naming-convention',
  },
  {
    name: 'a web component of more than 150 lines, in the collect feature too',
    file: `web/features/collect/components/${tag}-long-component.tsx`,
    source: longFunction('export function LongProbe() {', 'return <p>{total}</p>;'),
    rule: 'max-lines-per-function',
  },
  {
    name: 'a web hook of more than 150 lines in a .ts file',
    file: `web/features/collect/lib/${tag}-long-hook.ts`,
    source: longFunction('export function useLongProbe() {', 'return total;'),
    rule: 'max-lines-per-function',
  },
  // The allowed directions, so the rules above are shown to refuse only what they should.
  {
    name: 'an api feature imports a shared api place, db and shared',
    file: `api/sites/${tag}-allowed-api.ts`,
    source: [
      `import { newToken } from '../lib/tokens';`,
      `import { NotFound } from '../errors';`,
      `import { Site } from '../../db/entities/site.entity';`,
      `import { parseDecimal } from '../../shared/units/parse-decimal';`,
      `export const probe = [newToken, NotFound, Site, parseDecimal];`,
      '',
    ].join('\n'),
    rule: null,
  },
  {
    name: 'a web feature imports its own folder, web/lib, web/components and shared',
    file: `web/features/reports/${tag}-allowed-web.ts`,
    source: [
      `import { sitePathFor } from './${tag}-allowed-web-own';`,
      `import { cn } from '../../lib/cn';`,
      `import { Alert } from '../../components/ui/alert';`,
      `import { parseDecimal } from '../../../shared/units/parse-decimal';`,
      `export const probe = [sitePathFor, cn, Alert, parseDecimal];`,
      '',
    ].join('\n'),
    rule: null,
  },
  {
    name: 'a kebab-case file in the same feature',
    file: `web/features/reports/${tag}-allowed-web-own.ts`,
    source: `export const sitePathFor = (id: string) => \`/sites/\${id}\`;\n`,
    rule: null,
  },
];

let results = new Map<string, ESLint.LintResult>();

function removeProbes() {
  for (const probe of probes) fs.rmSync(path.join(root, probe.file), { force: true });
}

beforeAll(async () => {
  try {
    for (const probe of probes) fs.writeFileSync(path.join(root, probe.file), probe.source);
    const eslint = new ESLint({ cwd: root });
    const linted = await eslint.lintFiles(probes.map((probe) => probe.file));
    results = new Map(linted.map((result) => [path.relative(root, result.filePath), result]));
  } finally {
    // The probes live in the real folders (so the folder rules apply): never leave one behind.
    removeProbes();
  }
}, 240_000);

afterAll(removeProbes);

describe('architecture lint rules', () => {
  it('removes every probe file after linting', () => {
    for (const probe of probes) expect(fs.existsSync(path.join(root, probe.file))).toBe(false);
  });

  for (const probe of probes) {
    if (probe.rule === null) {
      it(`accepts: ${probe.name}`, () => {
        const result = results.get(probe.file);
        expect(result, `${probe.file} was not linted`).toBeDefined();
        expect(result!.messages.map((m) => `${m.ruleId}: ${m.message}`)).toEqual([]);
      });
    } else {
      it(`refuses: ${probe.name}`, () => {
        const result = results.get(probe.file);
        expect(result, `${probe.file} was not linted`).toBeDefined();
        const rules = result!.messages.map((message) => message.ruleId);
        // A fatal parse error would also be an error: make sure it is the expected rule.
        expect(result!.messages.filter((message) => message.fatal)).toEqual([]);
        expect(rules).toContain(probe.rule);
      });
    }
  }
});
