/**
 * A parsed scenario document that remembers where each value came from, so that every error can
 * name file, line and column next to the path inside the document.
 */
import { isMap, isSeq, LineCounter, parseDocument, type Document, type Node as YamlNode } from 'yaml';
import { badInput, syntaxError, type DocPath, type InputError, type SourceLocation } from '../errors.ts';

/** A document plus a way to locate any path in it. */
export interface LocatedDocument {
  readonly file: string | undefined;
  readonly data: unknown;
  /** Line and column of the value at `path` (or of the nearest parent that exists). */
  locate(path: DocPath): SourceLocation;
  /** A located bad-input error for the value at `path`. */
  fail(path: DocPath, rule: string, value: unknown, code?: string): InputError;
}

/**
 * Parses YAML or JSON text (JSON is read as YAML 1.2, which contains it).
 * @param text the scenario text.
 * @param file the file name, for messages.
 * @throws InputError with code E_SYNTAX and the line and column of the first syntax error.
 */
export function parseLocatedDocument(text: string, file?: string): LocatedDocument {
  const lineCounter = new LineCounter();
  const doc = parseDocument(text, { lineCounter, uniqueKeys: true, prettyErrors: false, strict: true });
  if (doc.errors.length > 0) {
    const e = doc.errors[0];
    const pos = lineCounter.linePos(e.pos[0]);
    throw syntaxError(file, e.message.split('\n')[0], pos.line, pos.col);
  }
  const data = doc.toJS({ maxAliasCount: 100 });
  return makeLocated(doc, lineCounter, data, file);
}

/** Wraps plain data (built in code, no text) so that the same validation can run on it. */
export function plainDocument(data: unknown, file?: string): LocatedDocument {
  return {
    file,
    data,
    locate: () => ({ file }),
    fail: (path, rule, value, code) => badInput(path, rule, value, code, { file }),
  };
}

function makeLocated(doc: Document, lc: LineCounter, data: unknown, file: string | undefined): LocatedDocument {
  const locate = (path: DocPath): SourceLocation => {
    for (let n = path.length; n >= 0; n--) {
      const node = nodeAt(doc, path.slice(0, n));
      if (node?.range) {
        const pos = lc.linePos(node.range[0]);
        return { file, line: pos.line, column: pos.col };
      }
    }
    return { file };
  };
  return {
    file,
    data,
    locate,
    fail: (path, rule, value, code) => badInput(path, rule, value, code, locate(path)),
  };
}

function nodeAt(doc: Document, path: DocPath): YamlNode | undefined {
  let node: unknown = doc.contents;
  for (const key of path) {
    if (isMap(node)) {
      const pair = node.items.find((p) => {
        const k = p.key as { value?: unknown } | null;
        return k !== null && typeof k === 'object' && String(k.value) === String(key);
      });
      if (!pair) return undefined;
      node = pair.value;
    } else if (isSeq(node) && typeof key === 'number') {
      node = node.items[key];
    } else {
      return undefined;
    }
  }
  return node as YamlNode | undefined;
}
