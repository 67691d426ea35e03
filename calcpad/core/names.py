"""How a calc name prints: Greek letters and subscripts, in one place.

``sigma_b`` → σ_b, ``F_y`` → F_y, ``Omega_c`` → Ω_c, ``D_o`` → D_o, ``FS`` → FS (upright-free
multi-letter names print as one italic word, not a product of letters).
"""

from __future__ import annotations

import functools
import keyword
import re

__all__ = ["NAME_PATTERN", "RATIO_NAMES", "is_valid_name", "name_latex", "name_mathml", "name_text", "split_name"]

NAME_PATTERN = re.compile(r"^[A-Za-z][A-Za-z0-9_]*$")

_GREEK_LOWER = [
    "alpha",
    "beta",
    "gamma",
    "delta",
    "epsilon",
    "zeta",
    "eta",
    "theta",
    "iota",
    "kappa",
    "lambda",
    "mu",
    "nu",
    "xi",
    "omicron",
    "pi",
    "rho",
    "sigma",
    "tau",
    "upsilon",
    "phi",
    "chi",
    "psi",
    "omega",
]
_GREEK_UNICODE = "αβγδεζηθικλμνξοπρστυφχψω"
_GREEK_UPPER_UNICODE = "ΑΒΓΔΕΖΗΘΙΚΛΜΝΞΟΠΡΣΤΥΦΧΨΩ"
# LaTeX has no macro for upper-case Greek letters that look Latin.
_LATIN_LOOKALIKE = {"Alpha", "Beta", "Epsilon", "Zeta", "Eta", "Iota", "Kappa", "Mu", "Nu", "Omicron", "Rho", "Tau", "Chi"}


def is_valid_name(name: str) -> bool:
    """True when ``name`` can name a given or step (letters, digits, underscores; starts with a
    letter; not a Python keyword such as ``lambda``, which a formula could not use)."""
    return bool(NAME_PATTERN.match(name)) and "__" not in name and not name.endswith("_") and not keyword.iskeyword(name)


def split_name(name: str) -> tuple[str, list[str]]:
    """Split ``F_cr_x`` into base ``F`` and subscripts ``["cr", "x"]``."""
    base, *subs = name.split("_")
    return base, [s for s in subs if s]


def _greek_index(word: str) -> int | None:
    low = word.lower()
    if low in _GREEK_LOWER:
        return _GREEK_LOWER.index(low)
    return None


def _word_latex(word: str, italic_multi: bool = True) -> str:
    idx = _greek_index(word)
    if idx is not None:
        if word[0].isupper():
            if word in _LATIN_LOOKALIKE:
                return _GREEK_UPPER_UNICODE[idx]
            return "\\" + word.capitalize()
        return "\\" + word.lower()
    if len(word) > 1 and not word.isdigit() and italic_multi:
        return rf"\mathit{{{word}}}"
    return word


#: Names that print as a ratio of two symbols: base and first subscript -> (numerator, denominator).
#: ``KL_r`` is the slenderness KL/r, not KL with a subscript r; ``KL_r_x`` prints (KL/r)_x.
RATIO_NAMES = {("KL", "r"): ("KL", "r"), ("Lc", "r"): ("L_c", "r"), ("L", "ra"): ("L", "r_a")}


def _ratio(name: str) -> tuple[str, str, list[str]] | None:
    base, subs = split_name(name)
    if subs and (base, subs[0]) in RATIO_NAMES:
        num, den = RATIO_NAMES[(base, subs[0])]
        return num, den, subs[1:]
    return None


@functools.lru_cache(maxsize=4096)
def name_latex(name: str) -> str:
    """LaTeX for a name: ``sigma_b`` → ``\\sigma_{b}``, ``FS`` → ``\\mathit{FS}``, ``KL_r`` → KL/r."""
    ratio = _ratio(name)
    if ratio is not None:
        num, den, rest = ratio
        body = f"{name_latex(num)}/{name_latex(den)}"
        return body if not rest else rf"\left({body}\right)_{{{','.join(_word_latex(s, italic_multi=False) for s in rest)}}}"
    base, subs = split_name(name)
    out = _word_latex(base)
    if subs:
        out += "_{" + ",".join(_word_latex(s, italic_multi=False) for s in subs) + "}"
    return out


def _word_text(word: str) -> str:
    idx = _greek_index(word)
    if idx is None:
        return word
    return (_GREEK_UPPER_UNICODE if word[0].isupper() else _GREEK_UNICODE)[idx]


@functools.lru_cache(maxsize=4096)
def name_text(name: str) -> str:
    """Plain-text form: ``sigma_b`` → ``σ_b``, ``Omega_c`` → ``Ω_c``, ``KL_r`` → ``KL/r``."""
    ratio = _ratio(name)
    if ratio is not None:
        num, den, rest = ratio
        body = f"{name_text(num)}/{name_text(den)}"
        return body if not rest else f"({body})_" + ",".join(_word_text(s) for s in rest)
    base, subs = split_name(name)
    out = _word_text(base)
    if subs:
        out += "_" + ",".join(_word_text(s) for s in subs)
    return out


@functools.lru_cache(maxsize=4096)
def name_mathml(name: str) -> str:
    """Presentation MathML for a name (``<msub><mi>σ</mi><mi>b</mi></msub>``; KL_r as KL/r)."""
    ratio = _ratio(name)
    if ratio is not None:
        num, den, rest = ratio
        body = f"<mrow>{name_mathml(num)}<mo>/</mo>{name_mathml(den)}</mrow>"
        if not rest:
            return body
        sub = ",".join(_word_text(s) for s in rest)
        return f"<msub><mrow><mo>(</mo>{body}<mo>)</mo></mrow><mi>{sub}</mi></msub>"
    base, subs = split_name(name)
    b = _word_text(base)
    variant = ' mathvariant="italic"' if len(b) > 1 else ""
    base_ml = f"<mi{variant}>{b}</mi>"
    if not subs:
        return base_ml
    sub_txt = ",".join(_word_text(s) for s in subs)
    sub_variant = ' mathvariant="italic"' if len(sub_txt) > 1 else ""
    return f"<msub>{base_ml}<mi{sub_variant}>{sub_txt}</mi></msub>"
