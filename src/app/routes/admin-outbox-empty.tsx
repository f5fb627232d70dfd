export function Component() {
  return <p className="text-sm text-ink-soft">Choose a message on the left to read it.</p>;
}
