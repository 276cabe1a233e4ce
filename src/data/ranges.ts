/**
 * Physical ranges checked on every row of lab data, in SI. A value outside is rejected with its
 * row ('out-of-range'), so a typing slip such as 1e308 K cannot widen the covered range that the
 * fit reports and the hand-off carries. The bounds are deliberately wide (common practice: no
 * chemical reactor runs outside them); they catch mistakes, not unusual chemistry.
 */

export interface PhysicalRange {
  /** Smallest accepted SI value (exclusive when `open`). */
  min: number;
  /** Largest accepted SI value. */
  max: number;
  /** True when min itself is refused. */
  open: boolean;
  /** SI unit of min and max. */
  unit: string;
}

/** Ranges by quantity name as used in row messages. */
export const PHYSICAL_RANGES = {
  /** Above 0 K, at most 5000 K (hotter than any reactor; molecules fall apart). */
  temperature: { min: 0, max: 5000, open: true, unit: 'K' },
  /** Above 0 Pa, at most 1e9 Pa (10 kbar, beyond high-pressure synthesis). */
  pressure: { min: 0, max: 1e9, open: true, unit: 'Pa' },
} as const satisfies Record<string, PhysicalRange>;

/** The message for a value outside `r`, or undefined when inside. */
export function outsideRange(si: number, r: PhysicalRange, what: string): string | undefined {
  const low = r.open ? !(si > r.min) : !(si >= r.min);
  if (!low && si <= r.max) return undefined;
  return `${what} ${si} ${r.unit} is outside the accepted range ${r.open ? 'above' : 'from'} ${r.min} ${r.unit} ${r.open ? 'up to' : 'to'} ${r.max} ${r.unit}`;
}
