/**
 * How an anisotropic channel, given only its q = 0 Hartree and Fock couplings H and F, acts on a
 * particle-hole pair of wavevector q (in 1/l_B; public/notes.html#dispersion). A channel with
 * interaction v(p) has the direct (Hartree, RPA bubble) part D(q) = v(q) exp(-q^2/2) / (2 pi) and
 * the exchange (ladder) part X(q) = integral d^2p / (2 pi)^2 v(p) exp(-p^2/2) exp(i p x q), with
 * D(0) = H and X(0) = F. The channel is read as the interaction that H and F determine:
 *
 * - 0 < F/H <= 1 (one sign, exchange no stronger than direct): a Gaussian
 *   v(p) = g exp(-p^2 a^2 / 2) with a^2 = H/F - 1, the range of public/notes.html#interaction-range
 *   (F/H = 1 / (1 + a^2)). Then D(q) = H exp(-q^2 H / 2F) and X(q) = F exp(-q^2 F / 2H); a = 0
 *   is the contact interaction, D = H e^(-q^2/2), X = F e^(-q^2/2).
 * - otherwise (F/H > 1, opposite signs, or one of them zero) no interaction of one sign and one
 *   range gives H and F: the channel is read as a contact part c plus a Gaussian part g of range
 *   l_B, H = c + g and F = c + g/2 (so g = 2 (H - F), c = 2F - H), the simplest sum of two ranges
 *   that reproduces every pair: D(q) = c e^(-q^2/2) + g e^(-q^2), X(q) = c e^(-q^2/2) + (g/2)
 *   e^(-q^2/4). It meets the first reading at F = H (g = 0).
 *
 * Both readings fall to zero at large q, so a branch tends to its particle-hole energy there.
 */
export type ChannelReading =
  | { readonly kind: 'gaussian'; readonly rangeSquared: number }
  | { readonly kind: 'contactPlusGaussian'; readonly contact: number; readonly gaussian: number };

/** The reading of a channel with couplings H (hartree) and F (fock); see the file comment. */
export function channelReading(hartree: number, fock: number): ChannelReading {
  const ratio = fock / hartree;
  if (hartree !== 0 && ratio > 0 && ratio <= 1) {
    return { kind: 'gaussian', rangeSquared: hartree / fock - 1 };
  }
  return {
    kind: 'contactPlusGaussian',
    contact: 2 * fock - hartree,
    gaussian: 2 * (hartree - fock),
  };
}

/**
 * D(q) - H and X(q) - F of a channel: what its direct and exchange parts lose between q = 0 and
 * q. Written with expm1 so that both are exactly 0 at q = 0 and accurate at small q.
 */
export function channelChange(
  hartree: number,
  fock: number,
  q: number,
): { direct: number; exchange: number } {
  if (q === 0 || (hartree === 0 && fock === 0)) return { direct: 0, exchange: 0 };
  const q2 = q * q;
  const reading = channelReading(hartree, fock);
  if (reading.kind === 'gaussian') {
    return {
      direct: hartree * Math.expm1((-q2 * hartree) / (2 * fock)),
      exchange: fock * Math.expm1((-q2 * fock) / (2 * hartree)),
    };
  }
  const { contact, gaussian } = reading;
  return {
    direct: contact * Math.expm1(-q2 / 2) + gaussian * Math.expm1(-q2),
    exchange: contact * Math.expm1(-q2 / 2) + (gaussian / 2) * Math.expm1(-q2 / 4),
  };
}
