// The dye's safety data sheet, opened in a new tab; a quiet caution when none is linked.
export function SdsLink({ url, name }: { url: string | null; name: string }) {
  if (!url) return <span className="text-sm text-caution">No safety sheet linked</span>;
  return (
    <a
      href={url}
      target="_blank"
      rel="noopener noreferrer"
      className="inline-flex min-h-11 items-center gap-1 text-accent underline underline-offset-2 hover:no-underline"
      aria-label={`Safety data sheet for ${name} (opens in a new tab)`}
    >
      Safety sheet <span aria-hidden="true">↗</span>
    </a>
  );
}
