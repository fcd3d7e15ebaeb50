// A table on a tablet, a stack of cards on a phone: one DOM, the cell's header comes from data-label.
export const T = {
  table: 'w-full border-collapse text-left',
  thead: 'hidden md:table-header-group',
  th: 'border-b-2 border-graphite px-2 py-1 align-bottom text-sm font-bold tracking-wider uppercase text-graphite-2',
  tbody: 'block md:table-row-group',
  tr: 'card mb-3 block p-2 md:mb-0 md:table-row md:rounded-none md:border-0 md:border-b md:border-rule md:p-0',
  td: 'flex gap-3 py-1 before:w-28 before:shrink-0 before:text-sm before:font-bold before:tracking-wider before:text-graphite-2 before:uppercase before:content-[attr(data-label)] md:table-cell md:px-2 md:py-2 md:align-top md:before:hidden',
};
