"""Studies over many evaluations: alternatives side by side, sweeps, auto-sizing, longest span."""
