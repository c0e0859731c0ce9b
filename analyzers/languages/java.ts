import { fieldText, treeSitterLanguage } from './tree-sitter';

/** Java: methods, constructors (also compact record constructors) and lambdas; names `Outer.Inner.method`. */
export const java = treeSitterLanguage({
  id: 'java',
  extensions: ['.java'],
  wasm: 'tree-sitter-java.wasm',
  comments: new Set(['line_comment', 'block_comment', 'comment']),
  literals: {
    decimal_integer_literal: 'number',
    hex_integer_literal: 'number',
    octal_integer_literal: 'number',
    binary_integer_literal: 'number',
    decimal_floating_point_literal: 'number',
    hex_floating_point_literal: 'number',
    string_literal: 'string',
    text_block: 'string',
    character_literal: 'char',
    true: 'boolean',
    false: 'boolean',
  },
  identifiers: new Set(['identifier', 'type_identifier']),
  containers: {
    class_declaration: (node) => fieldText(node, 'name'),
    interface_declaration: (node) => fieldText(node, 'name'),
    enum_declaration: (node) => fieldText(node, 'name'),
    record_declaration: (node) => fieldText(node, 'name'),
    annotation_type_declaration: (node) => fieldText(node, 'name'),
  },
  functions: new Set(['method_declaration', 'constructor_declaration', 'compact_constructor_declaration', 'lambda_expression']),
  span(node, owner) {
    if (node.type === 'lambda_expression') return { name: '<anonymous>', kind: 'lambda' };
    const name = fieldText(node, 'name') ?? '<anonymous>';
    const qualified = owner ? `${owner}.${name}` : name;
    if (node.type === 'method_declaration') {
      // Abstract and interface methods have no body: nothing was written to copy.
      return node.childForFieldName('body') ? { name: qualified, kind: 'method' } : undefined;
    }
    return { name: qualified, kind: 'constructor' };
  },
});
