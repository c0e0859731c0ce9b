import type { Node } from 'web-tree-sitter';
import { fieldText, treeSitterLanguage } from './tree-sitter';

/** The receiver's type name of a Go method: `func (s *Store) Get()` → `Store`. */
function receiverType(node: Node): string | undefined {
  const receiver = node.childForFieldName('receiver');
  if (!receiver) return undefined;
  const found = receiver.descendantsOfType('type_identifier')[0];
  return found?.text;
}

/**
 * Go: functions, methods (named `Type.method` after the receiver) and function literals.
 * Go has no classes; the receiver type plays that part in names.
 */
export const go = treeSitterLanguage({
  id: 'go',
  extensions: ['.go'],
  wasm: 'tree-sitter-go.wasm',
  comments: new Set(['comment']),
  literals: {
    int_literal: 'number',
    float_literal: 'number',
    imaginary_literal: 'number',
    interpreted_string_literal: 'string',
    raw_string_literal: 'string',
    rune_literal: 'char',
    true: 'boolean',
    false: 'boolean',
  },
  identifiers: new Set(['identifier', 'type_identifier', 'field_identifier', 'package_identifier', 'label_name']),
  containers: {},
  functions: new Set(['function_declaration', 'method_declaration', 'func_literal']),
  span(node) {
    if (node.type === 'func_literal') return { name: '<anonymous>', kind: 'lambda' };
    const name = fieldText(node, 'name') ?? '<anonymous>';
    if (!node.childForFieldName('body')) return undefined; // assembly-backed declarations
    if (node.type === 'method_declaration') {
      const owner = receiverType(node);
      return { name: owner ? `${owner}.${name}` : name, kind: 'method' };
    }
    return { name, kind: 'function' };
  },
});
