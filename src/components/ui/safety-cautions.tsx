/** The usual cautions for a portrait set; the venue's rules and local regulations come first. */
export function SafetyCautions() {
  return (
    <div className="text-sm">
      <ul className="flex list-disc flex-col gap-1.5 pl-5">
        <li>Sandbag every light stand and spread its legs fully; keep walkways clear.</li>
        <li>Tape down or ramp cables; do not chain extension leads.</li>
        <li>Flash packs can hold a dangerous charge, and modelling lamps get hot.</li>
        <li>
          A light on a boom over a sitter: counterweight the boom, lock every joint, secure the head
          and modifier with a safety cable, and keep the stand&apos;s leg under the boom.
        </li>
        <li>
          Ask sitters about flash sensitivity (photosensitive epilepsy): use single flashes only,
          never burst or strobe modes, and offer continuous light instead.
        </li>
        <li>
          While a flash-sensitive sitter is in a chair, every other station in the same room holds
          its flashes until that sitting ends.
        </li>
      </ul>
      <p className="mt-3 text-ink-muted">
        These are common practice, not a substitute for the venue&apos;s rules and local
        regulations, which come first.
      </p>
    </div>
  );
}
