import type { Node } from 'web-tree-sitter';
import type { FragmentKind } from '../types';
import { fieldText, treeSitterLanguage } from './tree-sitter';

function hasBody(node: Node): boolean {
  return node.children.some((c) => c !== null && (c.type === 'block' || c.type === 'arrow_expression_clause'));
}

const CONTAINER = (node: Node) => fieldText(node, 'name');

/**
 * C#: methods, constructors, destructors, operators, local functions, lambdas and anonymous
 * methods, and property accessors with a body (`Order.Total` as getter or setter).
 */
export const csharp = treeSitterLanguage({
  id: 'csharp',
  extensions: ['.cs'],
  wasm: 'tree-sitter-c_sharp.wasm',
  comments: new Set(['comment']),
  literals: {
    integer_literal: 'number',
    real_literal: 'number',
    string_literal: 'string',
    verbatim_string_literal: 'string',
    raw_string_literal: 'string',
    interpolated_string_expression: 'string',
    character_literal: 'char',
    boolean_literal: 'boolean',
  },
  identifiers: new Set(['identifier']),
  containers: {
    class_declaration: CONTAINER,
    struct_declaration: CONTAINER,
    interface_declaration: CONTAINER,
    record_declaration: CONTAINER,
    record_struct_declaration: CONTAINER,
  },
  functions: new Set([
    'method_declaration',
    'constructor_declaration',
    'destructor_declaration',
    'operator_declaration',
    'conversion_operator_declaration',
    'local_function_statement',
    'lambda_expression',
    'anonymous_method_expression',
    'accessor_declaration',
    'property_declaration',
  ]),
  span(node, owner) {
    const q = (name: string) => (owner ? `${owner}.${name}` : name);
    switch (node.type) {
      case 'lambda_expression':
      case 'anonymous_method_expression':
        return { name: '<anonymous>', kind: 'lambda' };
      case 'local_function_statement':
        return hasBody(node) ? { name: fieldText(node, 'name') ?? '<anonymous>', kind: 'function' } : undefined;
      case 'constructor_declaration':
        return { name: q(fieldText(node, 'name') ?? '<anonymous>'), kind: 'constructor' };
      case 'destructor_declaration':
        return { name: q(`~${fieldText(node, 'name') ?? ''}`), kind: 'method' };
      case 'operator_declaration':
      case 'conversion_operator_declaration':
        return hasBody(node) ? { name: q('operator'), kind: 'method' } : undefined;
      case 'property_declaration': {
        // `int Total => a + b;` is a getter written without an accessor list.
        const arrow = node.children.some((c) => c?.type === 'arrow_expression_clause');
        return arrow ? { name: q(fieldText(node, 'name') ?? '<anonymous>'), kind: 'getter' } : undefined;
      }
      case 'accessor_declaration': {
        if (!hasBody(node)) return undefined;
        const property = node.parent?.parent;
        const name = property ? (fieldText(property, 'name') ?? 'this') : '<anonymous>';
        const word = node.children.find((c) => c !== null && ['get', 'set', 'init', 'add', 'remove'].includes(c.type))?.type;
        const kind: FragmentKind = word === 'get' ? 'getter' : word === 'set' || word === 'init' ? 'setter' : 'method';
        return { name: q(name), kind };
      }
      default:
        return hasBody(node) ? { name: q(fieldText(node, 'name') ?? '<anonymous>'), kind: 'method' } : undefined;
    }
  },
});
