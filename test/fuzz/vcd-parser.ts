/**
 * A strict reader of the VCD subset phasegap writes, after IEEE Std 1364-2005 clause 18.2:
 * declaration commands each closed by $end, identifier codes of printable ASCII 33..126, scopes
 * balanced, one reference per name in a scope, time markers increasing, every change naming a
 * declared code. Returns the problems found (none for a good file) and the declared references.
 */

export interface VcdReading {
  readonly problems: string[];
  /** Declared references, scope path joined with '.'. */
  readonly vars: string[];
}

const DECLARATIONS = new Set(['$comment', '$date', '$version', '$timescale', '$scope', '$upscope', '$var', '$enddefinitions']);
const COMMANDS = new Set([...DECLARATIONS, '$dumpvars', '$dumpall', '$dumpon', '$dumpoff']);
const SCOPE_TYPES = new Set(['module', 'task', 'function', 'begin', 'fork']);
const VAR_TYPES = new Set([
  'event',
  'integer',
  'parameter',
  'real',
  'realtime',
  'reg',
  'supply0',
  'supply1',
  'time',
  'tri',
  'triand',
  'trior',
  'trireg',
  'tri0',
  'tri1',
  'wand',
  'wire',
  'wor',
]);
const PRINTABLE = /^[\x21-\x7e]+$/;
const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_$]*$/;

export function readVcdStrict(text: string): VcdReading {
  const problems: string[] = [];
  const vars: string[] = [];
  // Comment text may carry any printable character; the rest of the file is ASCII (18.2).
  if (/[\x00-\x08\x0b\x0c\x0e-\x1f\x7f]/.test(text)) problems.push('control characters');
  if (/[^\x09\x0a\x0d\x20-\x7e]/.test(text.replace(/\$(comment|date|version)\s[\s\S]*?\s\$end/g, '')))
    problems.push('characters outside ASCII outside $comment');
  const tokens = text.split(/\s+/).filter((t) => t !== '');
  let i = 0;
  const scope: string[] = [];
  const names = new Map<string, Set<string>>();
  const codes = new Set<string>();
  const until = (): string[] => {
    const start = i;
    while (i < tokens.length && tokens[i] !== '$end') i++;
    if (i >= tokens.length) problems.push(`${tokens[start - 1]} without $end`);
    return tokens.slice(start, i++);
  };
  let definitionsEnded = false;
  while (i < tokens.length && !definitionsEnded && problems.length === 0) {
    const t = tokens[i++]!;
    if (!DECLARATIONS.has(t)) {
      problems.push(`unexpected token in the header: ${JSON.stringify(t.slice(0, 40))}`);
      break;
    }
    const body = until();
    // Identifier codes may start with $, so only whole command words are out of place here.
    const free = t === '$comment' || t === '$date' || t === '$version';
    const command = body.find((b) => COMMANDS.has(b));
    if (!free && command !== undefined) problems.push(`${t} holds the command ${command}`);
    if (t === '$timescale' && !/^(1|10|100)\s*(s|ms|us|ns|ps|fs)$/.test(body.join(' ').replace(/^(\d+) /, '$1')))
      problems.push(`bad $timescale ${JSON.stringify(body.join(' '))}`);
    if (t === '$scope') {
      if (body.length !== 2 || !SCOPE_TYPES.has(body[0]!) || !IDENTIFIER.test(body[1]!))
        problems.push(`bad $scope ${JSON.stringify(body.join(' ').slice(0, 60))}`);
      scope.push(body[1] ?? '');
    }
    if (t === '$upscope') {
      if (body.length !== 0 || scope.length === 0) problems.push('unbalanced $upscope');
      scope.pop();
    }
    if (t === '$var') {
      const [type, size, code, ref, ...rest] = body;
      if (
        !type ||
        !VAR_TYPES.has(type) ||
        !/^[1-9]\d*$/.test(size ?? '') ||
        !code ||
        !PRINTABLE.test(code) ||
        !ref ||
        !IDENTIFIER.test(ref) ||
        rest.length > 1 ||
        (rest.length === 1 && !/^\[\d+(:\d+)?\]$/.test(rest[0]!))
      ) {
        problems.push(`bad $var ${JSON.stringify(body.join(' ').slice(0, 80))}`);
      } else {
        if (scope.length === 0) problems.push(`$var ${ref} outside any scope`);
        const key = scope.join('.');
        const inScope = names.get(key) ?? new Set<string>();
        if (inScope.has(ref)) problems.push(`duplicate reference ${key}.${ref}`);
        inScope.add(ref);
        names.set(key, inScope);
        codes.add(code);
        vars.push(`${key}.${ref}`);
      }
    }
    if (t === '$enddefinitions') {
      definitionsEnded = true;
      if (scope.length !== 0) problems.push('scopes left open at $enddefinitions');
    }
  }
  if (!definitionsEnded && problems.length === 0) problems.push('no $enddefinitions');
  let time = -1;
  while (i < tokens.length && problems.length === 0) {
    const t = tokens[i++]!;
    if (t === '$dumpvars' || t === '$end' || t === '$dumpall' || t === '$dumpon' || t === '$dumpoff') continue;
    if (t.startsWith('#')) {
      if (!/^#\d+$/.test(t)) {
        problems.push(`bad time ${t}`);
        break;
      }
      const now = Number(t.slice(1));
      if (now <= time) problems.push(`time ${now} does not increase (after ${time})`);
      time = now;
      continue;
    }
    if (/^[01xzXZ]/.test(t)) {
      if (!codes.has(t.slice(1))) problems.push(`change of undeclared code ${JSON.stringify(t)}`);
      continue;
    }
    problems.push(`unexpected token in the body: ${JSON.stringify(t.slice(0, 40))}`);
  }
  if (time < 0 && problems.length === 0) problems.push('no time marker');
  return { problems, vars };
}
