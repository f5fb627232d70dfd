/** Table cells for people: the name (marked when it is the signed-in person) and the e-mail. */
export function PersonName({ name, isYou }: { name: string; isYou: boolean }) {
  return (
    <span className="font-medium">
      {name}
      {isYou ? <span className="ml-2 font-mono text-xs font-normal text-ink-soft">(you)</span> : null}
    </span>
  );
}

export function EmailText({ email }: { email: string }) {
  return <span className="font-mono text-[0.8rem] text-ink-soft">{email}</span>;
}
