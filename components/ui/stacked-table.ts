/**
 * Class names for a table that, below `sm` (phones), shows each row as a card: the header row is kept
 * for screen readers only, the first cell is the card's title, and every other cell sits on a line of
 * its own under its column name (its `data-label`). Wide tables thus never scroll sideways on a phone.
 */
export const stackTable = "max-sm:block";
export const stackHead = "max-sm:sr-only";
export const stackBody = "max-sm:block max-sm:space-y-3";
export const stackRow =
  "max-sm:block max-sm:rounded-md max-sm:border max-sm:border-paper-200 max-sm:px-3 max-sm:py-2";
/** The cell that names the row: the card's title line. */
export const stackTitle = "max-sm:block max-sm:pr-0 [overflow-wrap:anywhere]";
/** A value cell: "COLUMN NAME ……… value" on a phone. Needs `data-label`. */
export const stackCell =
  "max-sm:flex max-sm:items-baseline max-sm:justify-between max-sm:gap-4 max-sm:py-1 max-sm:pr-0 max-sm:text-right max-sm:before:shrink-0 max-sm:before:text-left max-sm:before:font-sans max-sm:before:text-xs max-sm:before:tracking-wide max-sm:before:uppercase max-sm:before:text-ink-600 max-sm:before:content-[attr(data-label)]";
