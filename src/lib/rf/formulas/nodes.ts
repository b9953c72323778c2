/** Node shapes and per-node-kind tables shared by the formula compiler. */
import type { MathNode } from 'mathjs';
import type { CompileScope } from './types';
import { unitLiteral } from './sandbox';

/** The fields of mathjs nodes the compiler reads (mathjs's own types are a union without them). */
export interface AnyNode {
	type: string;
	name?: string;
	value?: unknown;
	fn?: unknown;
	op?: string;
	args?: MathNode[];
	content?: MathNode;
	condition?: MathNode;
	trueExpr?: MathNode;
	falseExpr?: MathNode;
}

/** Messages for node types outside the whitelist. */
export const REJECTED: Record<string, string> = {
	AccessorNode: 'property and index access (a.b, a[1]) is not allowed',
	AssignmentNode: 'assignment (=) is not allowed; a row gets its value from its formula',
	FunctionAssignmentNode: 'defining functions is not allowed',
	ObjectNode: 'objects { … } are not allowed',
	IndexNode: 'indexing is not allowed',
	BlockNode: 'only one expression is allowed (no ; or line breaks)',
	RangeNode: 'ranges (a:b) are not allowed',
	ArrayNode: 'matrices and lists [ … ] are not allowed',
	RelationalNode: 'chained comparisons are not allowed'
};

/** Comparisons; equality with the relative tolerance mathjs uses by default (1e-12). */
export const COMPARE: Record<string, (a: number, b: number) => boolean> = {
	larger: (a, b) => a > b,
	smaller: (a, b) => a < b,
	largerEq: (a, b) => a >= b,
	smallerEq: (a, b) => a <= b,
	equal: (a, b) => Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b)),
	unequal: (a, b) => Math.abs(a - b) > 1e-12 * Math.max(Math.abs(a), Math.abs(b))
};

/** True when a node is made only of units (`mm`, `m/s`, `m^2`), as the right side of `to`. */
export function isUnitOnly(node: MathNode, scope: CompileScope): boolean {
	const n = node as unknown as AnyNode;
	const args = n.args ?? [];
	switch (n.type) {
		case 'SymbolNode':
			return !scope.lookup(n.name as string) && unitLiteral(n.name as string) !== null;
		case 'ParenthesisNode':
			return isUnitOnly(n.content as MathNode, scope);
		case 'OperatorNode':
			if (n.fn === 'multiply' || n.fn === 'divide') return args.every((a) => isUnitOnly(a, scope));
			if (n.fn === 'pow') return isUnitOnly(args[0], scope) && args[1].type === 'ConstantNode';
			return false;
		default:
			return false;
	}
}
