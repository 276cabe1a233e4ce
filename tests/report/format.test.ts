import { describe, expect, it } from 'vitest';
import { axisTitle, escapeHtml, escapeMarkdown, formatInterval, formatNumber, formatUnit, slug } from '../../src/report/format';

describe('formatNumber', () => {
  it('uses fixed point for moderate magnitudes and significant digits', () => {
    expect(formatNumber(86210.4)).toBe('86210');
    expect(formatNumber(0.51234)).toBe('0.5123');
    expect(formatNumber(3)).toBe('3');
    expect(formatNumber(0)).toBe('0');
    expect(formatNumber(-12.3456, 3)).toBe('−12.3');
  });
  it('uses ×10ⁿ for very small and very large magnitudes', () => {
    expect(formatNumber(2.412e-3)).toBe('2.412×10⁻³');
    expect(formatNumber(-2.5e-7)).toBe('−2.5×10⁻⁷');
    expect(formatNumber(123456)).toBe('1.235×10⁵');
  });
  it('picks the form after rounding (no 100000 or 0.0100 artefacts)', () => {
    expect(formatNumber(99999.9)).toBe('1×10⁵');
    expect(formatNumber(9.99996)).toBe('10');
    expect(formatNumber(0.0099999)).toBe('0.01');
  });
  it('never prints NaN', () => {
    expect(formatNumber(NaN)).toBe('n/a');
    expect(formatNumber(Infinity)).toBe('n/a');
    expect(formatNumber(null)).toBe('not computed');
    expect(formatNumber(undefined)).toBe('not computed');
  });
});

describe('units and intervals', () => {
  it('makes exponents superscript and marks dimensionless quantities', () => {
    expect(formatUnit('mol/(kg s Pa^2)')).toBe('mol/(kg s Pa²)');
    expect(formatUnit('m^-3')).toBe('m⁻³');
    expect(formatUnit('1')).toBe('1');
    expect(formatUnit('')).toBe('1');
    expect(formatUnit('-')).toBe('1');
    expect(axisTitle('T', 'K')).toBe('T (K)');
  });
  it('shows open interval sides', () => {
    expect(formatInterval([0.391, null])).toBe('0.391 … open');
    expect(formatInterval(null)).toBe('not computed');
  });
});

describe('escaping', () => {
  it('escapes HTML special characters', () => {
    expect(escapeHtml(`<script>alert("x")</script> & 'y'`)).toBe('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &#39;y&#39;');
  });
  it('escapes Markdown table breakers', () => {
    expect(escapeMarkdown('a|b *c* [d]\nnext')).toBe('a\\|b \\*c\\* \\[d\\] next');
  });
  it('makes safe ids', () => {
    expect(slug('F_C out')).toBe('F_C-out');
    expect(slug('"><img')).toBe('img');
    expect(slug('²')).toBe('2');
  });
});
