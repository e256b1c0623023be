/**
 * XML files written through a DOM (@xmldom/xmldom) rather than by pasting strings: the serializer escapes every text
 * and attribute, so a name holding `&`, `<`, `]]>` or quotes stays text and can never become markup.
 */
import { DOMImplementation, XMLSerializer, type Document, type Element } from '@xmldom/xmldom';
import { plainText } from '../../contracts/text';

/** A new document with one namespaced root element. */
export function xmlDocument(namespace: string, root: string): Document {
  return new DOMImplementation().createDocument(namespace, root, null);
}

/**
 * Append `<name>text</name>` (namespace of the parent) and return it. Text passes through plainText, so characters
 * XML 1.0 cannot carry (NUL and other controls) and bidi overrides never reach the file.
 */
export function child(parent: Element, name: string, text?: string | number): Element {
  const doc = parent.ownerDocument!;
  const el = doc.createElementNS(parent.namespaceURI, name);
  if (text !== undefined) el.appendChild(doc.createTextNode(plainText(String(text))));
  parent.appendChild(el);
  return el;
}

/** A comment before the root element; "--" cannot occur inside an XML comment, so runs of hyphens become one. */
export function commentBeforeRoot(doc: Document, text: string): void {
  doc.insertBefore(doc.createComment(` ${plainText(text).replace(/-{2,}/g, '-').replace(/-$/, '- ')} `), doc.documentElement);
}

/** The document as UTF-8 XML text with its declaration. */
export function serialize(doc: Document): string {
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(doc)}\n`;
}
