// One look for comment text, shared by the editor and the rendered comments: paragraphs, lists,
// links, mentions and swatch chips (the HTML comes sanitised from the server).
export const richTextClass = [
  "break-words text-base leading-relaxed",
  "[&_p]:my-1 [&_p:first-child]:mt-0 [&_p:last-child]:mb-0",
  "[&_ul]:my-1 [&_ul]:list-disc [&_ul]:pl-6 [&_ol]:my-1 [&_ol]:list-decimal [&_ol]:pl-6",
  "[&_a]:text-accent [&_a]:underline [&_a]:underline-offset-2",
  "[&_.mention]:rounded [&_.mention]:bg-accent-soft [&_.mention]:px-1 [&_.mention]:font-medium [&_.mention]:text-accent",
  "[&_.swatch]:inline-flex [&_.swatch]:items-center [&_.swatch]:gap-1 [&_.swatch]:rounded-full [&_.swatch]:border [&_.swatch]:border-rule-strong [&_.swatch]:bg-sheet [&_.swatch]:py-0.5 [&_.swatch]:pr-2 [&_.swatch]:pl-0.5 [&_.swatch]:align-middle [&_.swatch]:font-mono [&_.swatch]:text-sm",
  "[&_.swatch-dot]:inline-block [&_.swatch-dot]:h-5 [&_.swatch-dot]:w-5 [&_.swatch-dot]:rounded-full [&_.swatch-dot]:border [&_.swatch-dot]:border-black/15",
].join(" ");
