/** Links that act as buttons (a page to go to, a file to download) look like the kit's buttons. */
export const linkButton =
  "inline-flex items-center gap-1.5 rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800";
export const secondaryLink =
  "inline-flex items-center gap-1.5 rounded-md border border-stone-300 bg-white px-3.5 py-2 text-sm font-medium text-stone-800 hover:bg-stone-100";
