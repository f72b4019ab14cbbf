import { DOMImplementation, XMLSerializer, type Document, type Element } from '@xmldom/xmldom';

/** Characters XML 1.0 does not allow in a document (§2.2 Char), so a strict reader would refuse the file. */
const NOT_XML_CHAR = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/**
 * A small builder over @xmldom/xmldom's DOM for the KML and GPX writers: elements in one
 * namespace, text escaped by the serializer, characters XML cannot carry dropped, and an indented
 * UTF-8 document out.
 */
export interface XmlWriter {
  readonly doc: Document;
  readonly root: Element;
  /** Appends `<name>` to `parent`, with `text` (if given) as its escaped text and `attributes` set. */
  add(parent: Element, name: string, text?: string | null, attributes?: Record<string, string>): Element;
  /** The document as text, with an XML declaration and two-space indentation. */
  serialize(): string;
}

/**
 * Starts a document with a root element in `namespace`.
 *
 * @param namespace - the default namespace URI of every element written
 * @param rootName - the root element's name
 * @param rootAttributes - attributes of the root (`xmlns:*` ones are set as namespace declarations)
 */
export function createXmlWriter(namespace: string, rootName: string, rootAttributes: Record<string, string> = {}): XmlWriter {
  const doc = new DOMImplementation().createDocument(namespace, rootName, null);
  const root = doc.documentElement!;
  const setAttributes = (element: Element, attributes: Record<string, string>) => {
    for (const [key, value] of Object.entries(attributes)) {
      if (key.startsWith('xmlns:')) element.setAttributeNS('http://www.w3.org/2000/xmlns/', key, value);
      else if (key.startsWith('xsi:')) element.setAttributeNS('http://www.w3.org/2001/XMLSchema-instance', key, value);
      else element.setAttribute(key, xmlText(value));
    }
  };
  setAttributes(root, rootAttributes);
  return {
    doc,
    root,
    add(parent, name, text, attributes = {}) {
      const element = doc.createElementNS(namespace, name);
      setAttributes(element, attributes);
      if (text !== undefined && text !== null) element.appendChild(doc.createTextNode(xmlText(text)));
      parent.appendChild(element);
      return element;
    },
    serialize() {
      indent(doc, root, 0);
      return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(doc)}\n`;
    },
  };
}

/** Text with the characters XML 1.0 cannot carry removed (escaping itself is the serializer's). */
export function xmlText(text: string): string {
  return text.replace(NOT_XML_CHAR, '');
}

/**
 * A number as xsd:decimal text: never in exponent form (which GPX's decimal types refuse), at
 * most `digits` decimals, without trailing zeros.
 */
export function decimalText(value: number, digits: number): string {
  const fixed = value.toFixed(digits);
  const trimmed = fixed.includes('.') ? fixed.replace(/\.?0+$/, '') : fixed;
  return trimmed === '-0' ? '0' : trimmed;
}

/** Puts each element with element children on its own indented lines (whitespace-only text nodes). */
function indent(doc: Document, element: Element, depth: number): void {
  const children = Array.from(element.childNodes);
  if (!children.some((child) => child.nodeType === child.ELEMENT_NODE)) return;
  for (const child of children) {
    element.insertBefore(doc.createTextNode(`\n${'  '.repeat(depth + 1)}`), child);
    if (child.nodeType === child.ELEMENT_NODE) indent(doc, child as Element, depth + 1);
  }
  element.appendChild(doc.createTextNode(`\n${'  '.repeat(depth)}`));
}
