/**
 * Checks on generated text that hold whatever the design file said: no NaN or Infinity anywhere a
 * number goes, and no user text outside the string literals and comments (C header), outside the title
 * line (SPICE netlist) or unescaped (SVG, JSON). Each returns the list of problems found (empty: clean),
 * so a failure message shows all of them.
 */

/** Words a non-finite number prints as, in C, JavaScript and SPICE. */
const NON_FINITE_WORD = /\b(nan|inf|infinity)\b/i;

/** The C header's code with string literals replaced by "" and comments by a space; null if a literal or comment is not closed. */
export function stripCCommentsAndStrings(text: string): string | null {
  let out = '';
  let i = 0;
  while (i < text.length) {
    const ch = text[i];
    if (ch === '/' && text[i + 1] === '*') {
      const end = text.indexOf('*/', i + 2);
      if (end < 0) return null;
      out += ' ';
      i = end + 2;
    } else if (ch === '/' && text[i + 1] === '/') {
      const end = text.indexOf('\n', i);
      i = end < 0 ? text.length : end;
    } else if (ch === '"' || ch === "'") {
      let j = i + 1;
      while (j < text.length && text[j] !== ch) {
        if (text[j] === '\n') return null;
        j += text[j] === '\\' ? 2 : 1;
      }
      if (j >= text.length) return null;
      out += `${ch}${ch}`;
      i = j + 1;
    } else {
      out += ch;
      i++;
    }
  }
  return out;
}

/** Problems of a C header: see the module comment. */
export function headerProblems(header: string): string[] {
  const problems: string[] = [];
  if (!/^[\x20-\x7e\n]*$/.test(header)) problems.push('a character outside printable ASCII and newline');
  const code = stripCCommentsAndStrings(header);
  if (code === null) return [...problems, 'a string literal or comment is not closed'];
  for (const [n, line] of code.split('\n').entries()) {
    if (NON_FINITE_WORD.test(line)) problems.push(`line ${n + 1}: a non-finite number: ${line.trim()}`);
    const t = line.trim();
    if (t.startsWith('#') && !/^#(ifndef|define|endif|include|if|else|elif)\b/.test(t)) problems.push(`line ${n + 1}: an unexpected directive: ${t}`);
    if (t.startsWith('#define') && !/^#define [A-Z][A-Z0-9_]*( |$)/.test(t)) problems.push(`line ${n + 1}: a macro name that is not an upper-case identifier: ${t}`);
  }
  const guards = code.match(/^#ifndef ([A-Z0-9_]+)$/m);
  if (!guards || !new RegExp(`^#define ${guards[1]}$`, 'm').test(code)) problems.push('no include guard');
  if ((code.match(/^#endif\b/gm) ?? []).length !== (code.match(/^#if(n?def)?\b/gm) ?? []).length) problems.push('unbalanced #if/#endif');
  return problems;
}

/** SPICE cards a netlist may contain (dot cards). `.control` would run commands: never. */
const ALLOWED_DOT_CARDS = new Set(['.subckt', '.ends', '.ac', '.end', '.option', '.options']);

/** Problems of a SPICE netlist: see the module comment. */
export function netlistProblems(netlist: string): string[] {
  const problems: string[] = [];
  if (!/^[\x20-\x7e\n]*$/.test(netlist)) problems.push('a character outside printable ASCII and newline');
  const lines = netlist.split('\n');
  // SPICE reads the first line as the title, but ngspice warns about (and rewrites) one that starts with punctuation.
  if (!/^[A-Za-z0-9]/.test(lines[0])) problems.push(`the title line starts with punctuation: ${lines[0]}`);
  if (lines[lines.length - 1] !== '' || lines[lines.length - 2] !== '.end') problems.push('does not end with .end and a newline');
  for (const [n, line] of lines.slice(1).entries()) {
    const t = line.trim();
    if (t === '' || t.startsWith('*')) continue;
    if (t.startsWith('+')) problems.push(`line ${n + 2}: a continuation line: ${t}`);
    const tokens = t.split(/\s+/);
    if (tokens[0].startsWith('.')) {
      if (!ALLOWED_DOT_CARDS.has(tokens[0].toLowerCase())) problems.push(`line ${n + 2}: an unexpected card ${tokens[0]}`);
    } else if (!/^[A-Za-z][A-Za-z0-9_]*$/.test(tokens[0])) problems.push(`line ${n + 2}: an element name that is not an identifier: ${tokens[0]}`);
    for (const tok of tokens.slice(1)) {
      if (NON_FINITE_WORD.test(tok)) problems.push(`line ${n + 2}: a non-finite number: ${t}`);
      if (/^[-+]?[\d.]/.test(tok) && !Number.isFinite(Number(tok))) problems.push(`line ${n + 2}: a number that does not parse: ${tok}`);
      if (!/^[A-Za-z0-9_.+\-=]+$/.test(tok)) problems.push(`line ${n + 2}: a token with other characters: ${tok}`);
    }
  }
  return problems;
}

/** Problems of an SVG document: well-formed tags, escaped text, no non-finite numbers in attributes. */
export function svgProblems(svg: string): string[] {
  const problems: string[] = [];
  const stack: string[] = [];
  const tag = /<(\/?)([A-Za-z?][\w:.-]*)((?:\s+[\w:-]+="[^"<]*")*)\s*(\/?|\?)>/g;
  let last = 0;
  for (let m = tag.exec(svg); m; m = tag.exec(svg)) {
    const text = svg.slice(last, m.index);
    if (text.includes('<')) problems.push(`an unmatched '<' near ${JSON.stringify(text.slice(0, 60))}`);
    for (const amp of text.matchAll(/&[^;]{0,10};?/g)) if (!/^&(#\d+|#x[0-9a-fA-F]+|amp|lt|gt|quot|apos);$/.test(amp[0])) problems.push(`a bare '&' in text: ${amp[0]}`);
    for (const ref of text.matchAll(/&#(\d+);/g)) {
      const c = Number(ref[1]);
      if ((c < 0x20 && c !== 9 && c !== 10 && c !== 13) || (c >= 0xd800 && c <= 0xdfff) || c === 0xfffe || c === 0xffff || c > 0x10ffff) problems.push(`a character reference not allowed in XML: ${ref[0]}`);
    }
    const attrs = m[3];
    if (NON_FINITE_WORD.test(attrs)) problems.push(`a non-finite number in <${m[2]}${attrs}>`);
    if (m[1] === '/') {
      if (stack.pop() !== m[2]) problems.push(`a closing </${m[2]}> that does not match`);
    } else if (m[4] !== '/' && m[4] !== '?') stack.push(m[2]);
    last = m.index + m[0].length;
  }
  if (svg.slice(last).trim() !== '') problems.push('text after the last tag');
  if (stack.length > 0) problems.push(`unclosed <${stack.join('>, <')}>`);
  if (!/^[\x09\x0a\x0d\x20-\x7e]*$/.test(svg)) problems.push('a raw character outside printable ASCII (should be a character reference)');
  return problems;
}

/** Problems of the JSON report: it parses, and nothing non-finite was written as a bare word. */
export function reportProblems(report: string): string[] {
  try {
    JSON.parse(report);
  } catch (e) {
    return [`does not parse: ${(e as Error).message}`];
  }
  return /[:,[]\s*-?(NaN|Infinity)\b/.test(report) ? ['a non-finite number'] : [];
}

/** Problems of a CSV output: a header of identifiers, then rows of finite decimal numbers of the same width. */
export function csvProblems(csv: string): string[] {
  const problems: string[] = [];
  const lines = csv.split('\n');
  if (lines[lines.length - 1] !== '') problems.push('no final newline');
  const header = lines[0].split(',');
  if (!header.every((h) => /^[a-z][a-z0-9_.%]*$/.test(h))) problems.push(`a header cell that is not an identifier: ${lines[0]}`);
  for (const [n, line] of lines.slice(1, -1).entries()) {
    const cells = line.split(',');
    if (cells.length !== header.length) problems.push(`line ${n + 2}: ${cells.length} cells, the header has ${header.length}`);
    for (const c of cells) if (!/^-?\d+(\.\d+)?(e[-+]?\d+)?$/.test(c) || !Number.isFinite(Number(c))) problems.push(`line ${n + 2}: not a finite decimal: ${c}`);
  }
  return problems;
}

/** Problems of every file of a rendered design, prefixed by the file name. */
export function outputProblems(files: Readonly<Record<string, string>>): string[] {
  const problems: string[] = [];
  for (const [name, text] of Object.entries(files)) {
    const found = name.endsWith('.h') ? headerProblems(text) : name.endsWith('.cir') ? netlistProblems(text) : name.endsWith('.svg') ? svgProblems(text) : name.endsWith('.json') ? reportProblems(text) : name.endsWith('.csv') ? csvProblems(text) : [`unexpected file ${name}`];
    for (const p of found) problems.push(`${name}: ${p}`);
    if (!/^[A-Za-z0-9_-]+(\.[a-z]+)$/.test(name) && name !== 'report.json') problems.push(`an unsafe file name: ${JSON.stringify(name)}`);
  }
  return problems;
}
