/**
 * Spreadsheet-formula neutralising for every CSV the app hands out (OWASP "CSV injection"): a
 * text cell whose first character is `=`, `+`, `-`, `@`, a tab or a carriage return gets a
 * leading `'`, so a spreadsheet shows it as text instead of running it. Numbers stay numbers
 * (`-12.5`, `+3`, `1,5` are left alone), and a cell that already starts with apostrophes before
 * such a character gets one more, so `undoNeutralisedCell` gives every cell back exactly.
 */

const TRIGGERS = new Set(["=", "+", "-", "@", "\t", "\r"]);

/** A plain number as a spreadsheet reads it: sign, digits, one decimal point or comma, exponent. */
const NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/;

/** Would a spreadsheet take this cell (after any leading apostrophes) as a formula? */
function startsLikeFormula(cell: string): boolean {
  const rest = cell.replace(/^'+/, "");
  return rest.length > 0 && TRIGGERS.has(rest[0]!);
}

/**
 * The cell as it goes into an export.
 *
 * @example neutraliseCell("=HYPERLINK(\"x\")") // "'=HYPERLINK(\"x\")"
 * @example neutraliseCell("-12.5") // "-12.5" (a number)
 * @example neutraliseCell("'=1") // "''=1" (so the import gives back "'=1")
 */
export function neutraliseCell(cell: string): string {
  if (NUMBER.test(cell) || !startsLikeFormula(cell)) return cell;
  return `'${cell}`;
}

/**
 * The cell as an import reads it: the one `'` an export added is taken off again.
 *
 * @example undoNeutralisedCell("'=HYPERLINK(\"x\")") // "=HYPERLINK(\"x\")"
 * @example undoNeutralisedCell("'plain") // "'plain" (never added by an export)
 */
export function undoNeutralisedCell(cell: string): string {
  return cell.startsWith("'") && startsLikeFormula(cell) ? cell.slice(1) : cell;
}

/**
 * Neutralises every cell of a delimited text as it stands: quoting, line ends and every other
 * byte are kept, so a file without formula-like cells comes back unchanged. A quoted cell gets
 * its `'` inside the quotes.
 *
 * @example neutraliseCsvText('rpm,note\r\n3000,"=1+1"\r\n', ",") // 'rpm,note\r\n3000,"\'=1+1"\r\n'
 */
export function neutraliseCsvText(text: string, delimiter: string): string {
  let out = "";
  let i = 0;
  const n = text.length;
  const ends = (c: string | undefined) => c === delimiter || c === "\n" || c === "\r";
  for (;;) {
    let j = i;
    if (text[j] === '"') {
      // A quoted cell: up to its closing quote ("" is a quote inside it), then to the separator.
      j++;
      while (j < n && !(text[j] === '"' && text[j + 1] !== '"')) j += text[j] === '"' ? 2 : 1;
      const inner = text.slice(i + 1, Math.min(j, n)).replaceAll('""', '"');
      const safe = neutraliseCell(inner);
      out += safe === inner ? text.slice(i, Math.min(j + 1, n)) : `"'${text.slice(i + 1, j + 1)}`;
      j = Math.min(j + 1, n);
      while (j < n && !ends(text[j])) out += text[j++];
    } else {
      while (j < n && !ends(text[j])) j++;
      out += neutraliseCell(text.slice(i, j));
    }
    if (j >= n) return out;
    if (text[j] === "\r" && text[j + 1] === "\n") {
      out += "\r\n";
      i = j + 2;
    } else {
      out += text[j];
      i = j + 1;
    }
    if (i >= n) return out;
  }
}
