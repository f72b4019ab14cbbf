/**
 * Escape text for XML character data and attribute values (the five predefined entities of
 * XML 1.0, W3C Recommendation, section 4.6).
 *
 * @param text - any text
 */
export function escapeXml(text: string): string {
  return text
    .replaceAll('&', '&amp;')
    .replaceAll('<', '&lt;')
    .replaceAll('>', '&gt;')
    .replaceAll('"', '&quot;')
    .replaceAll("'", '&apos;');
}
