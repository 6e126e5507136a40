import { describe, expect, it } from 'vitest';
import { escAttr, escText, unescapeXml, xmlProblem } from '../../src/export/xml';

// Expected verdicts follow the well-formedness rules of W3C XML 1.0 (from memory).
describe('xmlProblem: a strict well-formedness check', () => {
  it('accepts a document with declaration, comments, CDATA and references', () => {
    expect(xmlProblem('<?xml version="1.0"?>\n<a x="1" y=\'2\'><!-- c --><b/>t &amp; &#60; &#x3c;<![CDATA[<raw>]]></a>\n')).toBeNull();
  });

  it.each([
    ['<a><b></a>', /closes <b>/],
    ['<a></a><b/>', /second root/],
    ['<a>x & y</a>', /bare "&"/],
    ['<a>x < y</a>', /starts no tag/],
    ['<a>]]></a>', /"\]\]>" in text/],
    ['<a x=1/>', /not quoted/],
    ['<a x="<"/>', /"<" inside attribute/],
    ['<a x="&"/>', /bare "&"/],
    ['<a x="1" x="2"/>', /given twice/],
    ['<a>&nbsp;</a>', /unknown entity/],
    ['<a>\u0001</a>', /not allowed/],
    ['<a>', /never closed/],
    ['text<a/>', /outside the root/],
    ['', /no root/],
    ['<!DOCTYPE a><a/>', /not accepted/],
  ])('refuses %j', (text, why) => {
    expect(xmlProblem(text)?.message).toMatch(why);
  });

  it('fragments may have several roots but must balance', () => {
    expect(xmlProblem('<a/><b>x</b>', true)).toBeNull();
    expect(xmlProblem('<a><b/>', true)?.message).toMatch(/never closed/);
  });
});

describe('escaping', () => {
  it('text and attributes never become markup, and read back exactly', () => {
    const s = `<script>"it's" & ]]> </script>`;
    expect(escText(s)).toBe('&lt;script&gt;"it\'s" &amp; ]]&gt; &lt;/script&gt;');
    expect(escAttr(s)).toBe('&lt;script&gt;&quot;it&apos;s&quot; &amp; ]]&gt; &lt;/script&gt;');
    expect(xmlProblem(`<a t="${escAttr(s)}">${escText(s)}</a>`)).toBeNull();
    expect(unescapeXml(escText(s))).toBe(s);
    expect(unescapeXml(escAttr(s))).toBe(s);
  });

  it('characters XML cannot carry become U+FFFD (XML 1.0 Char production)', () => {
    expect(escText('a\u0000b\u001Fc\uFFFEd\uD800e')).toBe('a\uFFFDb\uFFFDc\uFFFDd\uFFFDe');
    expect(escText('tab\tnew\nline \uD83D\uDE00')).toBe('tab\tnew\nline \uD83D\uDE00'); // allowed, and a whole surrogate pair is kept
  });
});
