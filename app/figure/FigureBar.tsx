/** Figure export controls under the Map (built in the Figure issue). */
export function FigureBar() {
  return null;
}
