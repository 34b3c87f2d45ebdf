/**
 * Escaping for the HTML report. Every user-supplied string (experiment and method names,
 * setting values, failure reasons) passes through one of these before it reaches the page.
 */

const HTML_ESCAPES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** Escapes text for HTML element content and quoted attribute values (also inside SVG). */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c] ?? c);
}

/**
 * JSON that is safe inside a <script> element: `<`, `>` and `&` become \u003c, \u003e and
 * \u0026, so no `</script>` or `<!--` can end or change the element, and U+2028/U+2029 are
 * escaped for older JavaScript parsers (the OWASP XSS prevention cheat sheet, rule 3.1,
 * recommends this form of JSON embedding). The JSON value itself is unchanged.
 */
export function jsonForScript(value: unknown): string {
  return JSON.stringify(value)
    .replace(/</g, '\\u003c')
    .replace(/>/g, '\\u003e')
    .replace(/&/g, '\\u0026')
    .replace(/\u2028/g, '\\u2028')
    .replace(/\u2029/g, '\\u2029');
}
