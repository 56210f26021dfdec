/**
 * What a catalogue search looks for: the words as typed, and the same words with Greek letters
 * spelled out the way couplings are stored (α -> alpha, λ_g -> lambda_g, Ġ -> Gdot), so a pasted
 * symbol finds the coupling as well as its name does.
 */
const GREEK: Readonly<Record<string, string>> = {
  α: "alpha", β: "beta", γ: "gamma", δ: "delta", ε: "epsilon", ϵ: "epsilon", ζ: "zeta", η: "eta", θ: "theta", ι: "iota",
  κ: "kappa", λ: "lambda", μ: "mu", ν: "nu", ξ: "xi", π: "pi", ρ: "rho", σ: "sigma", τ: "tau", υ: "upsilon", φ: "phi",
  ϕ: "phi", χ: "chi", ψ: "psi", ω: "omega", Γ: "Gamma", Δ: "Delta", Θ: "Theta", Λ: "Lambda", Ξ: "Xi", Π: "Pi",
  Σ: "Sigma", Φ: "Phi", Ψ: "Psi", Ω: "Omega",
};

export function searchTerms(text: string): string[] {
  const typed = text.trim();
  const spelled = typed
    // A dot above a letter (Ġ, Ṁ) is a time derivative, stored as "Gdot", "Mdot".
    .normalize("NFD")
    .replace(/([A-Za-z])\u0307/g, "$1dot")
    .normalize("NFC")
    .replace(/[\u0370-\u03ff]/g, (c) => GREEK[c] ?? c)
    .replace(/√/g, "sqrt_")
    .replace(/\\/g, "");
  return [...new Set([typed, spelled].filter(Boolean))];
}
