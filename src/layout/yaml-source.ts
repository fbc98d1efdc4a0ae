/**
 * YAML text -> plain values plus a source map (path -> line:column), with the guards a file from
 * anyone needs: UTF-8 check, a size limit, one document only, no duplicate keys, names as keys,
 * known anchors only, no alias cycles, a bounded alias expansion (alias bombs, "billion laughs"),
 * and a depth limit.
 *
 * Parsing is done by the `yaml` package (YAML 1.2 core schema, with `<<` merge keys). We walk its
 * syntax tree ourselves instead of calling `toJS`, so that every value keeps the position it came
 * from and every problem becomes a located diagnostic, never an exception. The alias-expansion
 * guard counts what the aliases expand to (`expandedSize`, before the walk): a layout whose
 * qubits share defaults through `<<: *defaults` is a few values per use and passes, while a
 * "billion laughs" document, whose size multiplies with every level of aliases, is refused
 * without being expanded.
 *
 * Line breaks: YAML 1.2 allows CR alone as a line break; the yaml package reads only LF and
 * CR LF, so a lone CR is turned into LF first (one character for one: positions stay the same).
 */

import { isAlias, isMap, isScalar, isSeq, LineCounter, parseDocument, type Document, type Node } from 'yaml';
import { DiagnosticCollector, type Anchor, type Path, type Position } from './diagnostics.js';
import { readSimpleYaml, YAML_PARSE_OPTIONS } from './yaml-fast.js';

export const YAML_LIMITS = Object.freeze({
  /** Deepest nesting of lists and maps accepted. */
  maxDepth: 32,
  /** Largest file accepted (a 10,000-qubit layout is about 2.4 MB and takes about 4 s to read). */
  maxBytes: 8 * 1024 * 1024,
  /**
   * Most values (scalars, lists, maps) once aliases are expanded. A layout of 10,000 qubits
   * (the largest `check` accepts, src/cli/work-limits.ts) has about 300,000.
   */
  maxNodes: 1_000_000,
});

export interface SourceTree {
  /** The document as plain values: objects, arrays, strings, numbers, booleans, null. */
  value: unknown;
  /** Position of a path's key or value in the text (undefined for unknown paths). */
  locate(path: Path, anchor: Anchor): Position | undefined;
}

/**
 * Decode a file's bytes as UTF-8 (a leading byte-order mark is dropped); undefined on bad bytes or
 * a file over `kind.maxBytes`. `kind` names the file in messages (default: a YAML layout).
 */
export function decodeUtf8(
  bytes: Uint8Array,
  collector: DiagnosticCollector,
  kind: { noun: string; format: string; maxBytes: number } = { noun: 'a layout file', format: 'YAML', maxBytes: YAML_LIMITS.maxBytes },
): string | undefined {
  if (bytes.length > kind.maxBytes) {
    collector.addAt(undefined, `expected ${kind.noun} of at most ${kind.maxBytes} bytes, found ${bytes.length} bytes`);
    return undefined;
  }
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return text.startsWith('\uFEFF') ? text.slice(1) : text;
  } catch {
    const lossy = new TextDecoder('utf-8').decode(bytes);
    const at = lossy.indexOf('\uFFFD');
    const before = lossy.slice(0, Math.max(0, at));
    const line = before.split('\n').length;
    const column = at - before.lastIndexOf('\n');
    collector.addAt({ line, column }, `expected UTF-8 text, found bytes that are not UTF-8 (is this a ${kind.format} file?)`);
    return undefined;
  }
}

const pathKey = (path: Path): string => JSON.stringify(path);

/** Parse YAML text; problems go to `collector` and make the result undefined. */
export function readYamlSource(text: string, collector: DiagnosticCollector, options: { fast?: boolean } = {}): SourceTree | undefined {
  // Text in the plain subset that generated layouts use is read by ./yaml-fast.ts (the same
  // values and positions, about 1 s less for a 1,024-qubit layout in a fresh process); the rest,
  // and every text with a problem to report, by the yaml package below. `fast: false` skips it.
  const simple = options.fast === false ? undefined : readSimpleYaml(text, YAML_LIMITS.maxNodes);
  if (simple) {
    const { value, valuePositions, keyPositions } = simple;
    return {
      value,
      locate: (path, anchor) => (anchor === 'key' ? keyPositions.get(pathKey(path)) : undefined) ?? valuePositions.get(pathKey(path)),
    };
  }
  const lineCounter = new LineCounter();
  const doc = parseDocument(text.replace(/\r(?!\n)/g, '\n'), {
    lineCounter,
    ...YAML_PARSE_OPTIONS, // uniqueKeys: false: duplicates are reported by the walk below, with both positions
  });
  const at = (offset: number | undefined): Position | undefined => {
    if (offset === undefined) return undefined;
    const p = lineCounter.linePos(offset);
    return { line: p.line, column: p.col };
  };

  // 1. Syntax errors and warnings (unknown tags and the like are errors for a layout).
  let syntaxProblems = 0;
  let nestingReported = false;
  for (const problem of [...doc.errors, ...doc.warnings]) {
    if (problem.code === 'RESOURCE_EXHAUSTION') {
      if (nestingReported) continue;
      nestingReported = true;
      collector.addAt(at(problem.pos[0]), 'expected a layout document, found nesting too deep to read');
    } else if (problem.code === 'MULTIPLE_DOCS') {
      collector.addAt(at(problem.pos[0]), 'expected one YAML document, found several (remove the extra `---`)');
    } else if (problem.code === 'TAG_RESOLVE_FAILED') {
      collector.addAt(at(problem.pos[0]), `expected plain YAML values, found ${problem.message.replace(/^Unresolved tag/, 'the unknown tag')}`);
    } else {
      collector.addAt(at(problem.pos[0]), `YAML syntax: ${problem.message.split('\n')[0]}`);
    }
    syntaxProblems++;
  }
  if (syntaxProblems > 0) return undefined;

  // 2. Alias bombs: the size the aliases expand to, counted before anything is expanded.
  const size = doc.contents === null ? 0 : expandedSize(doc, doc.contents as Node);
  if (size > YAML_LIMITS.maxNodes) {
    const found = Number.isFinite(size) && size < 1e15 ? String(size) : 'far more';
    collector.addAt(undefined, `expected at most ${YAML_LIMITS.maxNodes} values once aliases are expanded, found ${found} (YAML alias bombs are refused)`);
    return undefined;
  }

  // 3. Walk the tree into plain values, keeping each value's position.
  const valuePositions = new Map<string, Position>();
  const keyPositions = new Map<string, Position>();
  if (doc.contents === null) valuePositions.set(pathKey([]), { line: 1, column: 1 }); // an empty document
  const walker = new Walker(doc, at, collector, valuePositions, keyPositions);
  const value = doc.contents === null ? null : walker.walk(doc.contents as Node, [], 0);
  if (walker.failed) return undefined;
  return {
    value,
    locate: (path, anchor) =>
      (anchor === 'key' ? keyPositions.get(pathKey(path)) : undefined) ?? valuePositions.get(pathKey(path)),
  };
}

/**
 * The number of values (scalars, lists, maps) `node` stands for once every alias is expanded,
 * computed once per node (memoised), so a billion-laughs document is sized in the time of its
 * text. Aliases to unknown anchors and alias cycles count as one value (the walk reports them);
 * nesting beyond the depth limit is not counted further (the walk reports it).
 */
export function expandedSize(doc: Document, root: Node): number {
  const memo = new Map<Node, number>();
  const open = new Set<Node>();
  const size = (node: Node | null, depth: number): number => {
    if (node === null || depth > YAML_LIMITS.maxDepth + 2) return 1;
    const known = memo.get(node);
    if (known !== undefined) return known;
    if (open.has(node)) return 1;
    open.add(node);
    let n = 1;
    if (isAlias(node)) {
      const target = node.resolve(doc);
      n = target ? size(target as Node, depth + 1) : 1;
    } else if (isSeq(node)) {
      for (const item of node.items) n += size(item as Node | null, depth + 1);
    } else if (isMap(node)) {
      for (const pair of node.items) {
        n += size(pair.key as Node | null, depth + 1) + size(pair.value as Node | null, depth + 1);
      }
    }
    open.delete(node);
    memo.set(node, n);
    return n;
  };
  return size(root, 0);
}

class Walker {
  failed = false;
  private nodes = 0;
  private readonly expanding = new Set<Node>();

  constructor(
    private readonly doc: Document,
    private readonly at: (offset: number | undefined) => Position | undefined,
    private readonly collector: DiagnosticCollector,
    private readonly valuePositions: Map<string, Position>,
    private readonly keyPositions: Map<string, Position>,
  ) {}

  private fail(path: Path, message: string, position: Position | undefined): undefined {
    this.failed = true;
    this.collector.add(path, message, 'value', position);
    return undefined;
  }

  walk(node: Node | null, path: Path, depth: number, aliasPosition?: Position): unknown {
    if (node === null) return null;
    const position = aliasPosition ?? this.at(node.range?.[0]);
    if (position && !this.valuePositions.has(pathKey(path))) this.valuePositions.set(pathKey(path), position);
    if (depth > YAML_LIMITS.maxDepth) {
      return this.fail(path, `expected at most ${YAML_LIMITS.maxDepth} levels of nesting, found more`, position);
    }
    if (++this.nodes > YAML_LIMITS.maxNodes) {
      if (this.nodes === YAML_LIMITS.maxNodes + 1) {
        this.fail(path, `expected at most ${YAML_LIMITS.maxNodes} values, found more`, position);
      }
      return undefined;
    }
    if (isScalar(node)) return node.value;
    if (isAlias(node)) {
      const target = node.resolve(this.doc);
      if (!target) {
        return this.fail(path, `expected a known anchor, found the alias *${node.source} (define &${node.source} before it)`, position);
      }
      if (this.expanding.has(target)) {
        return this.fail(path, `expected an alias to an earlier value, found *${node.source} inside the value it names (a cycle)`, position);
      }
      this.expanding.add(target);
      try {
        return this.walk(target, path, depth + 1, position);
      } finally {
        this.expanding.delete(target);
      }
    }
    if (isSeq(node)) {
      this.expanding.add(node);
      try {
        return node.items.map((item, i) => this.walk(item as Node | null, [...path, i], depth + 1));
      } finally {
        this.expanding.delete(node);
      }
    }
    if (isMap(node)) {
      this.expanding.add(node);
      try {
        return this.walkMap(node.items, path, depth, position);
      } finally {
        this.expanding.delete(node);
      }
    }
    return this.fail(path, 'expected a YAML value, found an unreadable node', position);
  }

  private walkMap(
    pairs: readonly { key: unknown; value: unknown }[],
    path: Path,
    depth: number,
    position: Position | undefined,
  ): Record<string, unknown> {
    const out: Record<string, unknown> = {};
    const firstSeen = new Map<string, Position | undefined>();
    const merges: { node: Node; position: Position | undefined }[] = [];
    for (const pair of pairs) {
      const keyNode = pair.key as Node | null;
      const keyPosition = this.at(keyNode?.range?.[0]) ?? position;
      if (isScalar(keyNode) && typeof keyNode.value === 'symbol') {
        // `<<: *defaults` or `<<: [*a, *b]` merge key: applied after the explicit keys.
        const v = pair.value as Node | null;
        if (v !== null) merges.push({ node: v, position: keyPosition });
        continue;
      }
      const key = keyName(keyNode);
      if (key === undefined) {
        const found = keyNode === null || (isScalar(keyNode) && keyNode.value === null)
          ? 'an empty key'
          : isScalar(keyNode) ? 'binary data' : 'a list or map used as a key';
        this.fail(path, `expected a name as map key, found ${found}`, keyPosition);
        continue;
      }
      const childPath = [...path, key];
      if (firstSeen.has(key)) {
        const first = firstSeen.get(key);
        const where = first ? ` (first given at line ${first.line}, column ${first.column})` : '';
        this.fail(childPath, `expected each key once in a map, found ${JSON.stringify(key)} again${where}`, keyPosition);
        continue;
      }
      firstSeen.set(key, keyPosition);
      if (keyPosition) this.keyPositions.set(pathKey(childPath), keyPosition);
      const valueNode = pair.value as Node | null;
      if (valueNode === null && keyPosition) this.valuePositions.set(pathKey(childPath), keyPosition);
      setOwn(out, key, this.walk(valueNode, childPath, depth + 1));
    }
    for (const merge of merges) {
      const sources = isSeq(merge.node) ? (merge.node.items as Node[]) : [merge.node];
      for (const source of sources) {
        const value = this.walk(source, path, depth + 1, merge.position);
        if (value === undefined) continue;
        if (value === null || typeof value !== 'object' || Array.isArray(value)) {
          this.fail(path, 'expected a map (or an alias of one) after the merge key <<, found something else', merge.position);
          continue;
        }
        for (const [k, v] of Object.entries(value)) {
          if (!Object.prototype.hasOwnProperty.call(out, k)) setOwn(out, k, v);
        }
      }
    }
    return out;
  }
}

/** A map key as a name: strings as they are, numbers and booleans as written; others undefined. */
function keyName(node: Node | null): string | undefined {
  if (!isScalar(node)) return undefined;
  const v = node.value;
  if (typeof v === 'string') return v;
  if (typeof v === 'number' || typeof v === 'boolean' || typeof v === 'bigint') {
    return typeof node.source === 'string' ? node.source : String(v);
  }
  return undefined;
}

/** Define an own enumerable property (safe for keys such as `__proto__`). */
function setOwn(target: Record<string, unknown>, key: string, value: unknown): void {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}
