import { BandIcon } from "@/components/wear/band-badge";

/*
 * The same shapes the status bands use, inline beside a figure, so a value at a limit is
 * marked by shape and words as well as colour (and prints in black and white).
 */
export function OverLimitMark() {
  return <BandIcon band="over_limit" className="mr-1 inline-block h-[1em] w-[1em] -translate-y-px align-middle" />;
}

export function CautionMark() {
  return <BandIcon band="renew_before_next" className="mr-1 inline-block h-[1em] w-[1em] -translate-y-px align-middle" />;
}

export function OkMark() {
  return <BandIcon band="steady" className="mr-1 inline-block h-[1em] w-[1em] -translate-y-px align-middle" />;
}
