// A quantity and its unit never part at a line end ("1,000 g", not "1,000 / g"): the space between
// a number and the unit after it becomes a non-breaking one. For text a screen shows, not for data.
export const keepUnits = (text: string) => text.replace(/(\d) (g|kg|s|ml|L|min|h)(?![\p{L}])/gu, '$1\u00a0$2');
