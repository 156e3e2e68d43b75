/** "Low" in words as well as colour, so the warning does not rest on colour alone. */
export function LowBadge() {
  return <span className="ml-2 inline-flex items-center rounded-full border border-amber-700 bg-amber-100 px-2 py-0.5 text-xs font-bold text-amber-900 uppercase">Low</span>
}
