// The small arithmetic a scenario may write where a number goes, e.g. "2 * /params/stiffnessPa + 1e3":
// numbers, the named parameters by their JSON pointers (/params/<name>), + - * /, unary minus,
// parentheses and the functions min, max, abs and round. Read by a recursive-descent parser of
// our own (no eval), evaluated in IEEE-754 doubles left to right as written, and bounded by
// interval arithmetic so the checks can tell the range a derived value can reach.
//
//   sum     := product (("+" | "-") product)*
//   product := unary (("*" | "/") unary)*
//   unary   := ("-" | "+") unary | primary
//   primary := number | pointer | name "(" sum ("," sum)* ")" | "(" sum ")"
//
// A "/" where an operand is due starts a pointer; where an operator is due it divides.

/** Where a parameter is named: "/params/<name>". */
export const PARAMS_POINTER = '/params';
/** Names of parameters: a letter, then letters, digits or "_" (no "-", which would read as minus). */
export const PARAMETER_NAME_PATTERN = '^[A-Za-z][A-Za-z0-9_]{0,63}$';

export type DerivedExpression =
  | { kind: 'number'; value: number }
  | { kind: 'parameter'; name: string; column: number }
  | { kind: 'negate'; operand: DerivedExpression }
  | { kind: 'binary'; operator: '+' | '-' | '*' | '/'; left: DerivedExpression; right: DerivedExpression }
  | { kind: 'call'; name: ExpressionFunction; args: DerivedExpression[] };

export type ExpressionFunction = 'min' | 'max' | 'abs' | 'round';

/** Arguments each function takes: [fewest, most]. */
const FUNCTIONS: Record<ExpressionFunction, [number, number]> = { min: [2, 16], max: [2, 16], abs: [1, 1], round: [1, 1] };
export const EXPRESSION_FUNCTIONS = Object.keys(FUNCTIONS) as ExpressionFunction[];

/** Longest expression read, in characters; scenarios need a line, not a program. */
export const MAX_EXPRESSION_LENGTH = 1000;
/** Deepest nesting of parentheses and unary signs; keeps the recursion far from the stack limit. */
const MAX_DEPTH = 64;

/** A syntax error at `column` (1-based, in characters of the expression). */
export class ExpressionSyntaxError extends Error {
  constructor(
    readonly column: number,
    readonly reason: string,
  ) {
    super(`column ${column}: ${reason}`);
    this.name = 'ExpressionSyntaxError';
  }
}

type Token =
  | { type: 'number'; value: number; column: number }
  | { type: 'pointer'; name: string; column: number }
  | { type: 'name'; name: string; column: number }
  | { type: 'symbol'; symbol: string; column: number }
  | { type: 'end'; column: number };

const NUMBER = /^(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/;
const NAME = /^[A-Za-z][A-Za-z0-9_]*/;

function describeToken(token: Token): string {
  switch (token.type) {
    case 'number':
      return `the number ${token.value}`;
    case 'pointer':
      return `${PARAMS_POINTER}/${token.name}`;
    case 'name':
      return `"${token.name}"`;
    case 'symbol':
      return `"${token.symbol}"`;
    case 'end':
      return 'the end';
  }
}

class Parser {
  private at = 0;
  private token: Token;
  private depth = 0;

  constructor(private readonly text: string) {
    this.token = this.read(true);
  }

  parse(): DerivedExpression {
    const tree = this.sum();
    if (this.token.type !== 'end') throw new ExpressionSyntaxError(this.token.column, `expected an operator (+ - * /) or the end, found ${describeToken(this.token)}`);
    return tree;
  }

  /** Reads the next token; `operand` says whether an operand (so a pointer) may start here. */
  private read(operand: boolean): Token {
    while (this.at < this.text.length && /\s/.test(this.text[this.at])) this.at++;
    const column = this.at + 1;
    if (this.at >= this.text.length) return { type: 'end', column };
    const rest = this.text.slice(this.at);
    const char = rest[0];
    if (operand && char === '/') {
      const prefix = `${PARAMS_POINTER}/`;
      if (!rest.startsWith(prefix)) throw new ExpressionSyntaxError(column, `a pointer here must start with "${prefix}", e.g. ${prefix}stiffnessPa`);
      const name = NAME.exec(rest.slice(prefix.length));
      if (name === null) throw new ExpressionSyntaxError(column + prefix.length, `expected a parameter name after "${prefix}" (a letter, then letters, digits or "_")`);
      this.at += prefix.length + name[0].length;
      return { type: 'pointer', name: name[0], column };
    }
    const number = NUMBER.exec(rest);
    if (number !== null) {
      this.at += number[0].length;
      const value = Number(number[0]);
      if (!Number.isFinite(value)) throw new ExpressionSyntaxError(column, `the number ${number[0]} is too large for a double`);
      return { type: 'number', value, column };
    }
    const name = NAME.exec(rest);
    if (name !== null) {
      this.at += name[0].length;
      return { type: 'name', name: name[0], column };
    }
    if ('+-*/(),'.includes(char)) {
      this.at += 1;
      return { type: 'symbol', symbol: char, column };
    }
    throw new ExpressionSyntaxError(column, `unexpected character "${char}"; an expression has numbers, ${PARAMS_POINTER}/<name>, + - * /, parentheses and ${EXPRESSION_FUNCTIONS.join(', ')}`);
  }

  private isSymbol(symbol: string): boolean {
    return this.token.type === 'symbol' && this.token.symbol === symbol;
  }

  private advance(operand: boolean): void {
    this.token = this.read(operand);
  }

  private sum(): DerivedExpression {
    let left = this.product();
    while (this.isSymbol('+') || this.isSymbol('-')) {
      const operator = (this.token as { symbol: '+' | '-' }).symbol;
      this.advance(true);
      left = { kind: 'binary', operator, left, right: this.product() };
    }
    return left;
  }

  private product(): DerivedExpression {
    let left = this.unary();
    while (this.isSymbol('*') || this.isSymbol('/')) {
      const operator = (this.token as { symbol: '*' | '/' }).symbol;
      this.advance(true);
      left = { kind: 'binary', operator, left, right: this.unary() };
    }
    return left;
  }

  private nested<T>(column: number, inner: () => T): T {
    if (++this.depth > MAX_DEPTH) throw new ExpressionSyntaxError(column, `nested more than ${MAX_DEPTH} deep; write it more simply`);
    try {
      return inner();
    } finally {
      this.depth--;
    }
  }

  private unary(): DerivedExpression {
    if (this.isSymbol('-') || this.isSymbol('+')) {
      const negate = this.isSymbol('-');
      const column = this.token.column;
      this.advance(true);
      const operand = this.nested(column, () => this.unary());
      return negate ? { kind: 'negate', operand } : operand;
    }
    return this.primary();
  }

  private primary(): DerivedExpression {
    const token = this.token;
    switch (token.type) {
      case 'number':
        this.advance(false);
        return { kind: 'number', value: token.value };
      case 'pointer':
        this.advance(false);
        return { kind: 'parameter', name: token.name, column: token.column };
      case 'name':
        return this.call(token.name, token.column);
      case 'symbol':
        if (token.symbol === '(') {
          this.advance(true);
          const inner = this.nested(token.column, () => this.sum());
          this.expectClose(token.column);
          return inner;
        }
        throw new ExpressionSyntaxError(token.column, `expected a number, ${PARAMS_POINTER}/<name>, a function or "(", found ${describeToken(token)}`);
      case 'end':
        throw new ExpressionSyntaxError(token.column, `the expression ends where a number, ${PARAMS_POINTER}/<name> or "(" is due`);
    }
  }

  private expectClose(openColumn: number): void {
    if (!this.isSymbol(')')) throw new ExpressionSyntaxError(this.token.column, `expected ")" to close the "(" at column ${openColumn}, found ${describeToken(this.token)}`);
    this.advance(false);
  }

  private call(name: string, column: number): DerivedExpression {
    if (!Object.hasOwn(FUNCTIONS, name)) {
      throw new ExpressionSyntaxError(column, `unknown function "${name}"; the functions are ${EXPRESSION_FUNCTIONS.join(', ')}, and parameters are written ${PARAMS_POINTER}/${name}`);
    }
    const fn = name as ExpressionFunction;
    this.advance(false);
    if (!this.isSymbol('(')) throw new ExpressionSyntaxError(this.token.column, `expected "(" after ${fn}`);
    const open = this.token.column;
    this.advance(true);
    const args = this.nested(column, () => {
      const list = [this.sum()];
      while (this.isSymbol(',')) {
        this.advance(true);
        list.push(this.sum());
      }
      return list;
    });
    this.expectClose(open);
    const [fewest, most] = FUNCTIONS[fn];
    if (args.length < fewest || args.length > most) {
      const wanted = fewest === most ? `${fewest}` : `${fewest} to ${most}`;
      throw new ExpressionSyntaxError(column, `${fn} takes ${wanted} argument${most === 1 ? '' : 's'} (got ${args.length})`);
    }
    return { kind: 'call', name: fn, args };
  }
}

/** Parses `text`; throws ExpressionSyntaxError with the column of the first mistake. */
export function parseDerivedExpression(text: string): DerivedExpression {
  if (text.length > MAX_EXPRESSION_LENGTH) throw new ExpressionSyntaxError(MAX_EXPRESSION_LENGTH + 1, `longer than ${MAX_EXPRESSION_LENGTH} characters; name parts of it as parameters`);
  return new Parser(text).parse();
}

/** The parameter names the expression uses, each once, with the column of its first use. */
export function parametersUsed(tree: DerivedExpression): Map<string, number> {
  const used = new Map<string, number>();
  const visit = (node: DerivedExpression): void => {
    if (node.kind === 'parameter') {
      if (!used.has(node.name)) used.set(node.name, node.column);
    } else if (node.kind === 'negate') visit(node.operand);
    else if (node.kind === 'binary') {
      visit(node.left);
      visit(node.right);
    } else if (node.kind === 'call') node.args.forEach(visit);
  };
  visit(tree);
  return used;
}

/** The value in doubles, each parameter's value given by `valueOf`. */
export function evaluateDerived(tree: DerivedExpression, valueOf: (name: string) => number): number {
  switch (tree.kind) {
    case 'number':
      return tree.value;
    case 'parameter':
      return valueOf(tree.name);
    case 'negate':
      return -evaluateDerived(tree.operand, valueOf);
    case 'binary':
      return applyOperator(tree.operator, evaluateDerived(tree.left, valueOf), evaluateDerived(tree.right, valueOf));
    case 'call':
      return applyFunction(tree.name, tree.args.map((arg) => evaluateDerived(arg, valueOf)));
  }
}

function applyOperator(operator: '+' | '-' | '*' | '/', a: number, b: number): number {
  if (operator === '+') return a + b;
  if (operator === '-') return a - b;
  if (operator === '*') return a * b;
  return a / b;
}

function applyFunction(name: ExpressionFunction, args: number[]): number {
  if (name === 'min') return Math.min(...args);
  if (name === 'max') return Math.max(...args);
  if (name === 'abs') return Math.abs(args[0]);
  return Math.round(args[0]);
}

export interface ValueInterval {
  min: number;
  max: number;
}

const EVERYTHING: ValueInterval = { min: -Infinity, max: Infinity };

function hull(values: number[]): ValueInterval {
  if (values.some(Number.isNaN)) return EVERYTHING;
  return { min: Math.min(...values), max: Math.max(...values) };
}

/**
 * An interval holding every value the expression can take when each parameter lies in its own
 * interval (interval arithmetic, Moore 1966). Correctly rounded +, −, × and ÷ are monotone in
 * each argument, so the double computed at any point lies within the bounds computed here. It
 * can be wider than the true range when a parameter appears twice (x − x gives [−w, w], not 0).
 * A divisor interval holding 0 gives (−∞, ∞).
 */
export function derivedInterval(tree: DerivedExpression, intervalOf: (name: string) => ValueInterval): ValueInterval {
  switch (tree.kind) {
    case 'number':
      return { min: tree.value, max: tree.value };
    case 'parameter':
      return intervalOf(tree.name);
    case 'negate': {
      const a = derivedInterval(tree.operand, intervalOf);
      return { min: -a.max, max: -a.min };
    }
    case 'binary':
      return operatorInterval(tree.operator, derivedInterval(tree.left, intervalOf), derivedInterval(tree.right, intervalOf));
    case 'call':
      return functionInterval(tree.name, tree.args.map((arg) => derivedInterval(arg, intervalOf)));
  }
}

function operatorInterval(operator: '+' | '-' | '*' | '/', a: ValueInterval, b: ValueInterval): ValueInterval {
  if (operator === '+') return hull([a.min + b.min, a.max + b.max]);
  if (operator === '-') return hull([a.min - b.max, a.max - b.min]);
  if (operator === '*') return hull([a.min * b.min, a.min * b.max, a.max * b.min, a.max * b.max]);
  if (b.min <= 0 && b.max >= 0) return EVERYTHING;
  return hull([a.min / b.min, a.min / b.max, a.max / b.min, a.max / b.max]);
}

function functionInterval(name: ExpressionFunction, args: ValueInterval[]): ValueInterval {
  if (name === 'min') return { min: Math.min(...args.map((a) => a.min)), max: Math.min(...args.map((a) => a.max)) };
  if (name === 'max') return { min: Math.max(...args.map((a) => a.min)), max: Math.max(...args.map((a) => a.max)) };
  if (name === 'round') return { min: Math.round(args[0].min), max: Math.round(args[0].max) };
  const [a] = args;
  if (a.min >= 0) return a;
  if (a.max <= 0) return { min: -a.max, max: -a.min };
  return { min: 0, max: Math.max(-a.min, a.max) };
}

/**
 * True when every value the expression can take is a whole number, whatever the parameters
 * draw: whole literals, whole parameters (per `isWhole`), +, −, × of whole values, min, max and
 * abs of whole values, and round of anything. A quotient never counts as whole.
 */
export function isWholeByConstruction(tree: DerivedExpression, isWhole: (name: string) => boolean): boolean {
  switch (tree.kind) {
    case 'number':
      return Number.isInteger(tree.value);
    case 'parameter':
      return isWhole(tree.name);
    case 'negate':
      return isWholeByConstruction(tree.operand, isWhole);
    case 'binary':
      return tree.operator !== '/' && isWholeByConstruction(tree.left, isWhole) && isWholeByConstruction(tree.right, isWhole);
    case 'call':
      return tree.name === 'round' || tree.args.every((arg) => isWholeByConstruction(arg, isWhole));
  }
}
