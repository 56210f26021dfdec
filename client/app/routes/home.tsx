export function Component() {
  return (
    <article className="max-w-3xl">
      <h1 className="text-4xl leading-tight mb-6">Bounds on deviations, read as bounds on theories</h1>
      <p className="text-lg leading-relaxed mb-4" data-testid="pitch">
        Dragoman is a reviewed catalogue of how specific theories of gravity map onto the theory-agnostic deviation parameters of
        gravitational-wave tests: the ppE phase coefficient β at exponent b, generalized-IMR coefficients δφ<sub>k</sub>, shifts of the ringdown's
        quasinormal modes, and the inspiral–merger–ringdown consistency of the remnant's mass and spin.
        Give it a bound you measured, and it translates it into a limit on every catalogued coupling, in the units people quote, with the
        validity of each approximation checked beside the number.
      </p>
      <dl className="mt-10 grid gap-6 sm:grid-cols-3 text-[0.95rem]">
        <div className="border-t-2 border-sea pt-3">
          <dt className="font-semibold">Theorists</dt>
          <dd className="text-ink-soft">submit a theory's mapping through forms; every expression is checked symbolically for symbols, dimensions, GR limit and PN order.</dd>
        </div>
        <div className="border-t-2 border-sea pt-3">
          <dt className="font-semibold">Editors</dt>
          <dd className="text-ink-soft">review submissions by role and publish numbered revisions, each readable with its diff.</dd>
        </div>
        <div className="border-t-2 border-sea pt-3">
          <dt className="font-semibold">Analysts</dt>
          <dd className="text-ink-soft">turn a number, a table over b or posterior samples into constraints with validity flags, plots and paper-ready tables.</dd>
        </div>
      </dl>
    </article>
  );
}
