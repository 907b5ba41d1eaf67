import { describe, expect, it } from 'vitest';
import { convergenceStudy, htmlReport, linePlot, studyPlot, studyTable } from '../../../src/index.js';
import { codeOf } from '../../support/errors.js';
import { byClass, elements, parseXml, textContent } from './xml.js';

const study = convergenceStudy(({ spacing }) => ({ linf: 2 * spacing! ** 2 }), { refine: 'space', spacings: [0.2, 0.1, 0.05] });
const plot = linePlot([{ label: 'T', x: [0, 1], y: [20, 80] }], { title: 'profile' });
const conv = studyPlot(study);

const page = htmlReport({
  title: 'Wall <draft> & "notes"',
  summary: "Runs of 2 h; it's a test",
  caution: 'Illustrative numbers <b>only</b>.\n\nCheck them independently.',
  sections: [
    { heading: 'Results & plots', blocks: [
      { kind: 'paragraph', text: 'First <p> & second.\n\nA new paragraph.' },
      { kind: 'figure', svg: plot, caption: 'A profile <1>' },
      { kind: 'figure', svg: `<?xml version="1.0" encoding="UTF-8"?>\n${conv}` },
    ] },
    { heading: 'Tables', blocks: [
      { kind: 'table', header: ['level', 'h', 'error'], rows: [[0, 0.2, 0.08], [1, 0.1, 1 / 49], ['a<b', '&', '>']], caption: 'Levels' },
      { kind: 'markdown', text: `${studyTable(study)}\n\nNotes:\n- first <item>\n- second` },
    ] },
  ],
});

describe('htmlReport', () => {
  const doc = parseXml(page);

  it('is one well-formed page: doctype, html root, balanced tags', () => {
    expect(page.startsWith('<!DOCTYPE html>\n<html lang="en">')).toBe(true);
    expect(doc.name).toBe('html');
    expect(elements(doc, 'head')).toHaveLength(1);
    expect(elements(doc, 'body')).toHaveLength(1);
    expect(elements(doc, 'meta')[0]!.attrs['charset']).toBe('utf-8');
  });

  it('is self-contained: inline CSS and SVG, nothing fetched, no script', () => {
    expect(elements(doc, 'style')).toHaveLength(1);
    expect(elements(doc, 'script')).toHaveLength(0);
    expect(elements(doc, 'link')).toHaveLength(0);
    expect(elements(doc, 'img')).toHaveLength(0);
    expect(page).not.toMatch(/https?:\/\/(?!www\.w3\.org\/2000\/svg)/);
    expect(page).not.toMatch(/@import|url\((?!#)/);
  });

  it('contains the SVGs as given (the XML prolog dropped)', () => {
    const svgs = elements(doc, 'svg');
    expect(svgs).toHaveLength(2);
    expect(page).toContain(plot);
    expect(page).toContain(conv);
    expect(page).not.toContain('<?xml');
    expect(elements(doc, 'figcaption').map(textContent)).toEqual(['A profile <1>']);
  });

  it('escapes < & > (and quotes) in every piece of user text', () => {
    expect(elements(doc, 'title').map(textContent)).toEqual(['Wall <draft> & "notes"']);
    expect(page).toContain('<title>Wall &lt;draft&gt; &amp; &quot;notes&quot;</title>');
    expect(page).toContain('First &lt;p&gt; &amp; second.');
    expect(page).toContain('it&#39;s a test');
    expect(page).toContain('<td>a&lt;b</td><td>&amp;</td><td>&gt;</td>');
    expect(page).toContain('<li>first &lt;item&gt;</li>');
    expect(page).not.toContain('<b>only</b>');
  });

  it('has the caution slot, sections with headings, tables from rows and from markdown', () => {
    const caution = byClass(doc, 'caution');
    expect(caution).toHaveLength(1);
    expect(elements(caution[0]!, 'p')).toHaveLength(2);
    expect(elements(doc, 'h2').map(textContent)).toEqual(['Results & plots', 'Tables']);
    const tables = elements(doc, 'table');
    // one from rows, two from studyTable (levels and fits)
    expect(tables).toHaveLength(3);
    expect(elements(tables[0]!, 'th').map(textContent)).toEqual(['level', 'h', 'error']);
    expect(elements(tables[0]!, 'td').map(textContent).slice(0, 6)).toEqual(['0', '0.2', '0.08', '1', '0.1', '0.0204082']);
    expect(elements(tables[1]!, 'th').map(textContent)).toEqual(['level', 'h', 'L∞ error', 'L∞ order']);
    expect(elements(tables[1]!, 'tr')).toHaveLength(4); // header and three levels
    // numbers right-aligned
    expect(byClass(tables[1]!, 'num').length).toBeGreaterThan(4);
    expect(elements(doc, 'li')).toHaveLength(2);
  });

  it('is deterministic', () => {
    expect(htmlReport({ title: 't', sections: [] })).toBe(htmlReport({ title: 't', sections: [] }));
  });

  it('refusals', () => {
    expect(codeOf(() => htmlReport({ title: 3 as never, sections: [] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => htmlReport({ title: 't', sections: [{ heading: 'h', blocks: [{ kind: 'figure', svg: '<div/>' }] }] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => htmlReport({ title: 't', sections: [{ heading: 'h', blocks: [{ kind: 'spreadsheet' } as never] }] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => htmlReport({ title: 't', sections: [{ heading: 'h', blocks: [{ kind: 'table', header: ['a', 'b'], rows: [[1]] }] }] }))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => htmlReport({ title: 't', sections: [{ heading: 'h', blocks: [{ kind: 'markdown', text: '| a | b |\n|---|---|\n| 1 |' }] }] }))).toBe('SHAPE_MISMATCH');
  });
});
