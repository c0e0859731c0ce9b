import type { Node } from 'web-tree-sitter';
import type { TokenClass } from '../tokens';
import type { SpanInfo } from './tree-sitter';

/**
 * What C and C++ share: literal and identifier node types and the walk from a function
 * definition's declarator to its name (`int *(*f)(void)` → `f`, `Store::get` → `Store.get`).
 */
export const C_LITERALS: Readonly<Record<string, TokenClass>> = {
  number_literal: 'number',
  string_literal: 'string',
  raw_string_literal: 'string',
  system_lib_string: 'string',
  char_literal: 'char',
  user_defined_literal: 'number',
  true: 'boolean',
  false: 'boolean',
};

export const C_IDENTIFIERS: ReadonlySet<string> = new Set([
  'identifier',
  'type_identifier',
  'field_identifier',
  'statement_identifier',
  'namespace_identifier',
]);

export const C_COMMENTS: ReadonlySet<string> = new Set(['comment']);

/** The declarator node that names a function definition, following pointers, references and parentheses. */
function nameNode(definition: Node): Node | null {
  let node = definition.childForFieldName('declarator');
  for (let guard = 0; node && guard < 50; guard++) {
    if (node.type === 'function_declarator' || node.type === 'pointer_declarator' || node.type === 'reference_declarator' || node.type === 'parenthesized_declarator') {
      node = node.childForFieldName('declarator') ?? node.namedChildren.find((c) => c !== null) ?? null;
      continue;
    }
    return node;
  }
  return null;
}

/** Span of a C or C++ function definition; `owner` is the enclosing class or struct (C++). */
export function cFunctionSpan(definition: Node, owner: string | undefined): SpanInfo | undefined {
  if (!definition.childForFieldName('body')) return undefined;
  const named = nameNode(definition);
  const raw = named?.text ?? '<anonymous>';
  const parts = raw.replace(/\s+/g, '').split('::').filter((p) => p.length > 0);
  const last = parts[parts.length - 1] ?? '<anonymous>';
  const scope = parts.slice(0, -1).map((p) => p.replace(/<.*>$/, ''));
  const qualified = [...(owner ? [owner] : []), ...scope, last].join('.');
  const className = scope.length > 0 ? scope[scope.length - 1] : owner?.split('.').pop();
  if (className !== undefined) {
    const kind = last === className ? 'constructor' : 'method';
    return { name: qualified, kind };
  }
  return { name: qualified, kind: 'function' };
}
