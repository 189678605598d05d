//! Lane–Emden polytropes (placeholder module; filled in by the polytrope work).
