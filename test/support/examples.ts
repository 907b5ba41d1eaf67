/**
 * Runs every `@example` in the TypeScript files of one source folder: each
 * is read from the source, transpiled (the examples are TypeScript), run
 * against a module's exports, and each `expression // expected` line is
 * compared with the value written after `//` (the longest prefix of the
 * comment that is a JavaScript literal, so that trailing explanations are
 * allowed; `Float64Array [...]` compares the elements).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

interface Example {
  where: string;
  lines: string[];
}

function examplesOf(dir: string, file: string): Example[] {
  const text = readFileSync(join(dir, file), 'utf8');
  const lines = text.split('\n').map((l) => l.replace(/^\s*\* ?/, ''));
  const out: Example[] = [];
  for (let i = 0; i < lines.length; i++) {
    const m = /^@example\s*(.*)$/.exec(lines[i]!.trim());
    if (m === null) continue;
    const where = `${file}:${i + 1}`;
    if (m[1] !== '') {
      out.push({ where, lines: [m[1]!] });
      continue;
    }
    // fenced block on the following lines
    const body: string[] = [];
    let j = i + 1;
    if (!lines[j]!.trim().startsWith('```')) throw new Error(`${where}: @example without code`);
    for (j += 1; !lines[j]!.trim().startsWith('```'); j++) body.push(lines[j]!);
    out.push({ where, lines: body });
  }
  return out;
}

function literal(comment: string): { value: unknown; typed: boolean } {
  let text = comment.trim();
  const typed = text.startsWith('Float64Array ');
  if (typed) text = text.slice('Float64Array '.length);
  for (let end = text.length; end > 0; end--) {
    try {
      return { value: new Function(`return (${text.slice(0, end)});`)() as unknown, typed };
    } catch {
      // not an expression yet: drop one more trailing character
    }
  }
  throw new Error(`no literal in "${comment}"`);
}

/**
 * Declares one test per `@example` in `dir`, run against `module`'s exports,
 * and one test that there are at least `atLeast` of them.
 */
export function describeExamples(title: string, dir: string, module: object, atLeast: number): void {
  const names = Object.keys(module);
  const values = names.map((k) => (module as Record<string, unknown>)[k]);
  const all = readdirSync(dir).filter((f) => f.endsWith('.ts')).sort().flatMap((f) => examplesOf(dir, f));
  describe(title, () => {
    it(`there is one on every exported function and type (${atLeast} at the time of writing)`, () => {
      expect(all.length).toBeGreaterThanOrEqual(atLeast);
    });

    for (const ex of all) {
      it(ex.where, () => {
        const checks: Array<{ line: string; want: { value: unknown; typed: boolean } }> = [];
        const code: string[] = [];
        for (const line of ex.lines) {
          const cut = line.lastIndexOf(' // ');
          if (cut < 0) {
            code.push(line);
            continue;
          }
          checks.push({ line, want: literal(line.slice(cut + 4)) });
          code.push(`__got.push(${line.slice(0, cut)});`);
        }
        expect(checks.length, 'an example states its result after //').toBeGreaterThan(0);
        const js = ts.transpileModule(code.join('\n'), {
          compilerOptions: { target: ts.ScriptTarget.ES2022, module: ts.ModuleKind.ESNext },
        }).outputText;
        const got: unknown[] = [];
        new Function('__got', ...names, js)(got, ...values);
        checks.forEach((c, k) => {
          const v = got[k];
          if (c.want.typed) {
            expect(v, c.line).toBeInstanceOf(Float64Array);
            expect(Array.from(v as Float64Array), c.line).toEqual(c.want.value);
          } else {
            expect(v, c.line).toEqual(c.want.value);
          }
        });
      });
    }
  });
}
