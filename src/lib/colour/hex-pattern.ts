/** The hex colours we accept, #rgb or #rrggbb (the # optional); no culori, so browser forms can check it cheaply. */
const HEX = /^#?([0-9a-f]{3}|[0-9a-f]{6})$/i;

export function isHexColour(value: string): boolean {
  return HEX.test(value);
}
