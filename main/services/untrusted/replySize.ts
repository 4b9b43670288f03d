/**
 * An upper estimate of how many bytes a value takes once posted to another thread. Strings count
 * two bytes a character: inside the worker a long message that repeats a cell's text is cheap
 * (V8 shares the text), but posting it copies every repetition — so a crafted file could make a
 * small worker send the main thread gigabytes. The worker refuses a reply over its budget.
 */
export function estimateReplyBytes(value: unknown, stopAbove: number): number {
  let total = 0;
  const stack: unknown[] = [value];
  while (stack.length > 0 && total <= stopAbove) {
    const v = stack.pop();
    total += 8;
    if (typeof v === 'string') total += v.length * 2;
    else if (Array.isArray(v)) for (const item of v as unknown[]) stack.push(item);
    else if (typeof v === 'object' && v !== null) {
      for (const [k, item] of Object.entries(v)) {
        total += k.length * 2;
        stack.push(item);
      }
    }
  }
  return total;
}
