import fs from 'node:fs';
import { createRequire } from 'node:module';
import { Language, Parser, type Node } from 'web-tree-sitter';
import type { FragmentSpan, ResolvedOptions } from '../fragments';
import { checkNestingDepth } from '../limits';
import { emptyTokenStream, pushToken, type TokenClass } from '../tokens';
import type { FragmentKind } from '../types';
import type { LanguageAnalysis, LanguageAnalyzer } from './language';

/**
 * The engine for languages parsed by tree-sitter grammars compiled to WebAssembly
 * (@repomix/tree-sitter-wasms). Tokens are the leaf nodes in source order, comments dropped;
 * a literal node is one token even when the grammar gives it children (string pieces, escapes,
 * interpolations), so a string edit changes one token, not several. Identifiers and literals are
 * classified by node type.
 *
 * Nesting works as for JavaScript (see babel.ts): a nested function is its own fragment and its
 * tokens also count in the enclosing one.
 */

/** What a function-like node becomes. `start` overrides the node's start (Python decorators). */
export interface SpanInfo {
  name: string;
  kind: FragmentKind;
  start?: number;
}

/** The per-language part: node types and how to name things. */
export interface TreeSitterSpec {
  id: string;
  extensions: readonly string[];
  /** File name under @repomix/tree-sitter-wasms/out/. */
  wasm: string;
  comments: ReadonlySet<string>;
  /** Node types read as one literal token, with their class. */
  literals: Readonly<Record<string, TokenClass>>;
  /** Leaf node types that are identifiers. */
  identifiers: ReadonlySet<string>;
  /** Class-like node types; the function gives the class name. */
  containers: Readonly<Record<string, (node: Node) => string | undefined>>;
  /** Node types that may be fragments; `span` decides (undefined: not a fragment). */
  functions: ReadonlySet<string>;
  /** `owner` is the name of the class the node sits in directly (no function in between). */
  span(node: Node, owner: string | undefined): SpanInfo | undefined;
}

const requireFromHere = createRequire(import.meta.url);
let initialised: Promise<void> | undefined;
const parsers = new Map<string, Promise<Parser>>();

async function parserFor(wasm: string): Promise<Parser> {
  let parser = parsers.get(wasm);
  if (!parser) {
    parser = (async () => {
      initialised ??= Parser.init();
      await initialised;
      const bytes = fs.readFileSync(requireFromHere.resolve(`@repomix/tree-sitter-wasms/out/${wasm}`));
      const language = await Language.load(bytes);
      const p = new Parser();
      p.setLanguage(language);
      return p;
    })();
    parsers.set(wasm, parser);
  }
  return parser;
}

interface Scope {
  end: number;
  /** Class name for a container, undefined for a function. */
  className: string | undefined;
}

/** Joins the contiguous run of class names on top of the scope stack: `Outer.Inner`. */
function ownerOf(scopes: readonly Scope[]): string | undefined {
  const names: string[] = [];
  for (let i = scopes.length - 1; i >= 0; i--) {
    const name = scopes[i].className;
    if (name === undefined) break;
    names.unshift(name);
  }
  return names.length > 0 ? names.join('.') : undefined;
}

/** Parses `text` with the spec's grammar and collects tokens and spans in one cursor walk. */
export async function analyzeWithTreeSitter(spec: TreeSitterSpec, text: string): Promise<LanguageAnalysis> {
  const parser = await parserFor(spec.wasm);
  const tree = parser.parse(text);
  if (!tree) throw new Error(`the ${spec.id} parser returned no tree`);
  const tokens = emptyTokenStream();
  const spans: FragmentSpan[] = [];
  const scopes: Scope[] = [];
  let errors = 0;
  const cursor = tree.walk();
  try {
    for (;;) {
      const type = cursor.nodeType;
      const start = cursor.startIndex;
      const end = cursor.endIndex;
      while (scopes.length > 0 && scopes[scopes.length - 1].end <= start && end > start) scopes.pop();
      let descend = true;
      if (type === 'ERROR') errors++;
      if (spec.comments.has(type)) {
        descend = false;
      } else if (Object.hasOwn(spec.literals, type)) {
        if (end > start) pushToken(tokens, start, end, text.slice(start, end), spec.literals[type]);
        descend = false;
      } else if (spec.functions.has(type) && cursor.nodeIsNamed) {
        // (named only: Python's `lambda` keyword is a leaf of the same type as the lambda node)
        const node = cursor.currentNode;
        const info = spec.span(node, ownerOf(scopes));
        // Only a real fragment opens a function scope: a C# property without a body must not
        // hide its class from the accessors inside it.
        if (info) {
          spans.push({ name: info.name, kind: info.kind, start: info.start ?? start, end });
          scopes.push({ end, className: undefined });
          checkNestingDepth(scopes.length);
        }
      } else if (Object.hasOwn(spec.containers, type) && cursor.nodeIsNamed) {
        const name = spec.containers[type](cursor.currentNode) ?? '<anonymous>';
        scopes.push({ end, className: name });
        checkNestingDepth(scopes.length);
      }
      if (descend && !cursor.gotoFirstChild()) {
        // A leaf. Zero-width leaves are tokens the parser invented to recover (MISSING) or
        // layout markers; neither was written by anyone.
        if (end > start) pushToken(tokens, start, end, text.slice(start, end), spec.identifiers.has(type) ? 'identifier' : 'other');
        descend = false;
      }
      if (descend) continue;
      let done = false;
      while (!cursor.gotoNextSibling()) {
        if (!cursor.gotoParent()) {
          done = true;
          break;
        }
      }
      if (done) break;
    }
    if (errors === 0 && tree.rootNode.hasError) errors = 1;
  } finally {
    cursor.delete();
    tree.delete();
  }
  return { tokens, spans, syntaxErrors: errors };
}

/** Turns a spec into a registry entry. */
export function treeSitterLanguage(spec: TreeSitterSpec): LanguageAnalyzer {
  return {
    id: spec.id,
    extensions: spec.extensions,
    async analyze(_path: string, text: string, _options: ResolvedOptions) {
      return analyzeWithTreeSitter(spec, text);
    },
  };
}

/** The text of a node's `name` field, if any. */
export function fieldText(node: Node, field: string): string | undefined {
  return node.childForFieldName(field)?.text ?? undefined;
}
