"""The record file's text: :func:`record_layout`, a readable, diff-friendly JSON layout.

One space of indent per level, like ``json.dumps(indent=1)``, down to each calc entry; below,
each step, check and table row is one line of compact JSON (``separators=(", ", ": ")``) written
by json's C encoder, so a diff of two records shows one line per changed step and printing a
calc's entry costs little more than the C encoder's own time (``json.dumps(indent=1)`` runs the
pure-Python encoder). A table of such records (a sheet's steps, its checks) is one encoder call
split after each record; sheets, tables and long lists of texts stay opened. ``json.loads``
reads the text back as the same value. :mod:`calcpad.runner.record` prints the record file with
it and :mod:`calcpad.runner.spool` each calc entry (byte for byte the same).
"""

from __future__ import annotations

import functools
import json
from collections.abc import Callable
from itertools import chain
from json.encoder import c_make_encoder, encode_basestring  # type: ignore[attr-defined]
from typing import Any

__all__ = ["OPEN_DEPTH", "TEXTS_WIDTH", "key_text", "record_layout"]


@functools.lru_cache(maxsize=64)
def _encoder(gap: str) -> Callable[[Any], str]:
    """Compact JSON with ``"," + gap`` between items (``" "``: on one line; a newline and an
    indent: a dict of plain values one item per line), no NaN/Infinity: json's C encoder, made
    once per gap (``json.dumps`` makes one per call)."""
    enc = json.JSONEncoder(ensure_ascii=False, allow_nan=False, separators=("," + gap, ": "))
    if c_make_encoder is None:  # pragma: no cover - CPython has the accelerator
        return enc.encode
    c_enc = c_make_encoder(None, enc.default, encode_basestring, None, ": ", "," + gap, False, False, False)
    return lambda value: "".join(c_enc(value, 0))


#: A value as compact JSON on one line (``separators=(", ", ": ")``).
_one_line = _encoder(" ")
#: Containers as the layout sees them (exact types; anything else json prints goes on one line).
_NESTED = frozenset((dict, list, tuple))
_DICT, _SEQS, _TEXT = frozenset((dict,)), frozenset((list, tuple)), frozenset((str,))
#: Containers at most this deep are always opened (the record, its blocks, each calc entry).
OPEN_DEPTH = 2
#: A deeper list of texts longer than this in all (a sheet's assumptions) gets one text per line.
TEXTS_WIDTH = 160


def _holds_nested(values: Any) -> bool:
    """Whether a container among ``values`` (other values are skipped) holds a container."""
    for v in values:
        kind = type(v)
        if kind is dict:
            if not _NESTED.isdisjoint(map(type, v.values())):
                return True
        elif kind in _SEQS and not _NESTED.isdisjoint(map(type, v)):
            return True
    return False


def _one_line_record(record: dict[Any, Any]) -> bool:
    """Whether a dict below :data:`OPEN_DEPTH` prints on one line: empty or holding a
    non-container, and no container of containers."""
    kinds = set(map(type, record.values()))
    if kinds.isdisjoint(_NESTED):
        return True  # flat (a step) or empty
    return not kinds <= _NESTED and not _holds_nested(record.values())


def _records_text(value: Any, items: Any) -> str | None:
    """The one-line text of ``value`` when its ``items`` (all dicts) each print on one line, else None.

    The text comes first (json's C encoder, needed anyway) and its brackets are counted: one per
    record and per container a record holds (none in a text) proves there is nothing deeper
    without looking at every value; otherwise each record is looked at."""
    if not _one_line_record(next(iter(items))):  # the first record tells a table of sheets early
        return None
    text = _one_line(value)
    braces, brackets = text.count("{"), text.count("[")
    own = type(value) is dict
    if braces == len(value) + own and brackets == 1 - own:
        return text  # flat records (steps) and no bracket in any text
    kinds = list(map(type, chain.from_iterable(map(dict.values, items))))
    inner = kinds.count(list) + kinds.count(tuple)
    if braces == len(value) + own + kinds.count(dict) and brackets == 1 - own + inner:
        return text if all(not r or not _NESTED.issuperset(map(type, r.values())) for r in items) else None
    return text if all(map(_one_line_record, items)) else None  # a bracket in a text


def _layout(value: Any, depth: int, out: list[str]) -> None:
    """Append the container ``value`` to ``out`` as the record file prints it ``depth`` levels deep.

    Opened, one item per line: always down to :data:`OPEN_DEPTH`; deeper, when every item is a
    container (a table of steps, checks, rows), some item holds containers (a sheet record) or it
    is a list of texts longer than :data:`TEXTS_WIDTH` in all (assumptions). Otherwise on one line."""
    is_dict = type(value) is dict
    items = value.values() if is_dict else value
    if not items:
        out.append(_one_line(value))
        return
    kinds = set(map(type, items))
    inner = "\n" + " " * (depth + 1)
    if kinds <= _NESTED:
        if kinds == _DICT and depth >= OPEN_DEPTH and (text := _records_text(value, items)) is not None:
            # each record on one line: a line break after each record's closing brace ("}, {" or
            # '}, "' is there only, when replaced once per record)
            mark = '}, "' if is_dict else "}, {"
            body = text[1:-1]
            lines = body.replace(mark, "}," + inner + mark[-1])
            if len(lines) - len(body) == (len(value) - 1) * (len(inner) - 1):
                out += (text[0], inner, lines, inner[:-1], text[-1])
                return
    elif depth > OPEN_DEPTH:
        if kinds.isdisjoint(_NESTED):  # plain values: one line, but for a long list of texts
            one_line = is_dict or kinds != _TEXT or sum(map(len, items)) <= TEXTS_WIDTH
        else:  # a record: one line, but for one holding a container of containers (a sheet)
            one_line = not _holds_nested(items)
        if one_line:
            out.append(_one_line(value))
            return
    out.append("{" if is_dict else "[")
    sep, depth = inner, depth + 1
    if is_dict:
        plain: dict[Any, Any] = {}  # a run of plain values: one encoder call, one per line
        for key, item in value.items():
            if type(item) not in _NESTED:
                plain[key] = item
                continue
            if plain:
                out.append(sep + _encoder(inner)(plain)[1:-1])
                sep, plain = "," + inner, {}
            out.append(sep + key_text(key) + ": ")
            _layout(item, depth, out)
            sep = "," + inner
        if plain:
            out.append(sep + _encoder(inner)(plain)[1:-1])
        out.append(inner[:-1] + "}")
        return
    for item in value:
        if type(item) in _NESTED:
            out.append(sep)
            _layout(item, depth, out)
        else:
            out.append(sep + _one_line(item))
        sep = "," + inner
    out.append(inner[:-1] + "]")


def key_text(key: Any) -> str:
    """A dict key as json.dumps prints it (a non-text key as its JSON text, quoted)."""
    return encode_basestring(key if type(key) is str else next(iter(json.loads(_one_line({key: None})))))


def record_layout(value: Any, depth: int = 0) -> str:
    """``value`` as the record file prints it ``depth`` levels deep (first line not indented).

    One space of indent per level, like ``json.dumps(indent=1)``, down to each step, check and
    table row, which is one line of compact JSON (``separators=(", ", ": ")``, written by json's C
    encoder), so a diff of two records shows one line per changed step. The record itself, its
    blocks and each calc entry are always opened (:data:`OPEN_DEPTH`); deeper, see
    :func:`_layout`. ``json.loads`` gives ``value`` back; non-finite numbers are refused."""
    if type(value) not in _NESTED:
        return _one_line(value)
    out: list[str] = []
    _layout(value, depth, out)
    return "".join(out)
