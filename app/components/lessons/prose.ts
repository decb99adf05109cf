/** Reading styles for lesson Markdown (headings, paragraphs, lists, tables, code) without a plugin. */
export const PROSE = [
  "max-w-none leading-relaxed",
  "[&_h2]:mt-8 [&_h2]:mb-2 [&_h2]:text-xl [&_h2]:font-bold [&_h2]:tracking-tight",
  "[&_h3]:mt-6 [&_h3]:mb-1 [&_h3]:text-lg [&_h3]:font-bold",
  "[&_p]:my-3 [&_ul]:my-3 [&_ul]:list-disc [&_ul]:pl-6 [&_ol]:my-3 [&_ol]:list-decimal [&_ol]:pl-6 [&_li]:my-1",
  "[&_table]:my-4 [&_table]:w-full [&_th]:border-b-2 [&_th]:border-ink [&_th]:px-2 [&_th]:py-1 [&_th]:text-left [&_th]:text-xs [&_th]:uppercase [&_th]:tracking-wide",
  "[&_td]:border-b [&_td]:border-rule [&_td]:px-2 [&_td]:py-1",
  "[&_code]:rounded [&_code]:bg-paper-deep [&_code]:px-1 [&_code]:text-[0.95em]",
  "[&_strong]:font-bold [&_em]:italic [&_a]:underline",
  "[&>*:first-child]:mt-0 [&>*:last-child]:mb-0",
].join(" ");
