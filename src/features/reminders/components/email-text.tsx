import { splitAtSign } from '../model/address';

/** An address that, when it must wrap, wraps before the @. */
export function EmailText({ email, className }: { email: string; className?: string }) {
  const [local, domain] = splitAtSign(email);
  return (
    <span className={className}>
      {local}
      <wbr />
      {domain}
    </span>
  );
}
