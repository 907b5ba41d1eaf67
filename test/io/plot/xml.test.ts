import { describe, expect, it } from 'vitest';
import { byClass, elements, parseXml, textContent } from './xml.js';

describe('the test XML checker itself', () => {
  it('parses elements, attributes, entities, comments and CDATA', () => {
    const r = parseXml('<?xml version="1.0"?>\n<a x="1 &amp; 2" y=\'&#60;\'><!-- c --><b class="k m">t &lt; u &#x263A;</b><![CDATA[<raw>]]><c/></a>\n');
    expect(r.name).toBe('a');
    expect(r.attrs).toEqual({ x: '1 & 2', y: '<' });
    expect(byClass(r, 'm').map((e) => e.name)).toEqual(['b']);
    expect(textContent(elements(r, 'b')[0]!)).toBe('t < u ☺');
    expect(textContent(r)).toContain('<raw>');
  });
  it('accepts a DOCTYPE before the root', () => {
    expect(parseXml('<!DOCTYPE html>\n<html><body/></html>').name).toBe('html');
  });
  it.each([
    ['<a><b></a></b>', 'closes'],
    ['<a>', 'never closed'],
    ['<a x="1" x="2"/>', 'duplicate'],
    ['<a x=1/>', 'not quoted'],
    ['<a x="<"/>', '< inside'],
    ['<a>1 & 2</a>', 'bare &'],
    ['<a>&nbsp;</a>', 'unknown entity'],
    ['<a/><b/>', 'after the root'],
    ['text', 'no root'],
    ['<a x="1"y="2"/>', 'separated'],
  ])('rejects %s', (src, why) => {
    expect(() => parseXml(src)).toThrow(why);
  });
});
