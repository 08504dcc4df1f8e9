// The text of a PDF, for tests: each content stream is inflated (FlateDecode, RFC 1950/1951, by
// Node's zlib) and the strings shown by TJ/Tj operators (PDF 32000-1:2008 §9.4.3, hexadecimal or
// literal strings, single-byte WinAnsi as the standard 14 fonts use) are joined, one text object
// (BT … ET) per line. Enough for PDFs drawn with the standard fonts; not a general PDF reader.
import zlib from 'node:zlib';

function literal(s: string): string {
  return s.replace(/\\([nrtbf()\\]|[0-7]{1,3})/g, (_m, e: string) => {
    const map: Record<string, string> = { n: '\n', r: '\r', t: '\t', b: '\b', f: '\f', '(': '(', ')': ')', '\\': '\\' };
    return map[e] ?? String.fromCharCode(parseInt(e, 8));
  });
}

const hex = (h: string) => Buffer.from(h.replace(/\s/g, ''), 'hex').toString('latin1');

/** The text shown in one content stream, one line per text object. */
function streamText(content: string): string[] {
  const lines: string[] = [];
  for (const block of content.split(/\bBT\b/).slice(1)) {
    const body = block.split(/\bET\b/)[0];
    let line = '';
    for (const m of body.matchAll(/\[((?:[^\]\\]|\\.)*)\]\s*TJ|<([0-9a-fA-F\s]*)>\s*Tj|\(((?:[^)\\]|\\.)*)\)\s*Tj/g)) {
      if (m[1] !== undefined)
        for (const p of m[1].matchAll(/<([0-9a-fA-F\s]*)>|\(((?:[^)\\]|\\.)*)\)/g)) line += p[1] !== undefined ? hex(p[1]) : literal(p[2]);
      else if (m[2] !== undefined) line += hex(m[2]);
      else line += literal(m[3]);
    }
    lines.push(line);
  }
  return lines;
}

/** Every line of text in the PDF, in the order drawn. */
export function pdfText(pdf: Buffer): string[] {
  const s = pdf.toString('latin1');
  if (!s.startsWith('%PDF-')) throw new Error('not a PDF');
  const out: string[] = [];
  for (const m of s.matchAll(/<<((?:(?!>>\s*stream)[\s\S])*)>>\s*stream\r?\n/g)) {
    const start = m.index + m[0].length;
    const end = s.indexOf('endstream', start);
    let data = pdf.subarray(start, end);
    if (/\/FlateDecode/.test(m[1])) {
      try {
        data = zlib.inflateSync(data);
      } catch {
        continue; // a font or image stream that is not text
      }
    }
    out.push(...streamText(data.toString('latin1')));
  }
  return out;
}
