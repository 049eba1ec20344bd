/**
 * Reads newline-delimited JSON (one JSON value per line) as it arrives in pieces: `push` takes
 * whatever text came in since the last call and returns the values of the lines it completed;
 * a line cut across two pieces is kept until its newline arrives. `end` returns the last line
 * when the stream stops without a final newline. A line that is not JSON is skipped and
 * counted in `skipped`, so one damaged line never hides the summary that follows.
 */
export function createNdjsonReader() {
  let pending = '';
  let skipped = 0;
  const parse = (line: string, out: unknown[]) => {
    const text = line.trim();
    if (text === '') return;
    try {
      out.push(JSON.parse(text));
    } catch {
      skipped++;
    }
  };
  return {
    push(text: string): unknown[] {
      const out: unknown[] = [];
      const lines = (pending + text).split('\n');
      pending = lines.pop() ?? '';
      for (const line of lines) parse(line, out);
      return out;
    },
    end(): unknown[] {
      const out: unknown[] = [];
      parse(pending, out);
      pending = '';
      return out;
    },
    get skipped() {
      return skipped;
    },
  };
}
