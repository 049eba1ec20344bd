/** Text with `backticked` spans set as code, as the API document's descriptions write them. */
export function WithCode({ text }: { text: string }) {
  return (
    <>
      {text.split(/`([^`]+)`/).map((part, i) =>
        i % 2 === 1 ? (
          <code key={i} className="font-mono text-ink">
            {part}
          </code>
        ) : (
          part
        ),
      )}
    </>
  );
}
