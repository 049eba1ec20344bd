import { useState } from 'react';
import { Button } from './button.tsx';

/**
 * Copies `text` to the clipboard and says so in a polite live region ("Copied"), or asks the
 * person to select and copy by hand where the browser refuses (no clipboard permission).
 */
export function CopyButton({ text, label = 'Copy', what }: { text: string; label?: string; what: string }) {
  const [state, setState] = useState<'idle' | 'copied' | 'failed'>('idle');
  async function copy() {
    try {
      await navigator.clipboard.writeText(text);
      setState('copied');
    } catch {
      setState('failed');
    }
  }
  return (
    <span className="inline-flex items-center gap-2">
      <Button size="sm" onClick={() => void copy()} aria-label={`${label} ${what}`}>
        {label}
      </Button>
      <span role="status" className="text-sm text-ink-soft">
        {state === 'copied' ? 'Copied' : state === 'failed' ? 'Copy by hand: select the text and copy it.' : ''}
      </span>
    </span>
  );
}
