"""Untrusted files are data only: size and depth limits, UTF-8, positions.

UTF-8 is defined by RFC 3629 (IETF, 2003); JSON by RFC 8259 (IETF, 2017), whose §9
allows a parser to limit nesting depth and sizes.
"""
from __future__ import annotations

import builtins
import json

import pytest

from stagewright.core.errors import ProjectFileError
from stagewright.core.project import parse
from stagewright.core.project.parse import MAX_DEPTH, MAX_FILE_BYTES, parse_bytes, position, read_limited


def _nested(depth: int) -> bytes:
    return ("[" * depth + "]" * depth).encode()


def test_depth_at_the_limit_parses_and_one_more_is_refused():
    assert parse_bytes(_nested(MAX_DEPTH)) is not None
    with pytest.raises(ProjectFileError, match=rf"line 1, column {MAX_DEPTH + 1}: nested more than {MAX_DEPTH}"):
        parse_bytes(_nested(MAX_DEPTH + 1))


def test_depth_is_checked_before_parsing(monkeypatch):
    # a hostile file nested far beyond the recursion limit must never reach the parser
    def parser_must_not_run(*a, **k):
        raise AssertionError("json.loads was called")
    monkeypatch.setattr(parse.json, "loads", parser_must_not_run)
    with pytest.raises(ProjectFileError, match="nested more than"):
        parse_bytes(_nested(200_000))


def test_brackets_inside_strings_do_not_count():
    text = json.dumps({"note": "[" * 1000 + '\\"{{{' + "}" * 50})
    assert parse_bytes(text.encode())["note"].startswith("[[[")


def test_size_limit_is_checked_before_reading(tmp_path, monkeypatch):
    big = tmp_path / "big.json"
    big.write_bytes(b" " * (MAX_FILE_BYTES + 1))

    def no_open(*a, **k):
        raise AssertionError("the file was opened")
    monkeypatch.setattr(builtins, "open", no_open)
    with pytest.raises(ProjectFileError, match=rf"{MAX_FILE_BYTES + 1} bytes, larger than {MAX_FILE_BYTES}"):
        read_limited(big)


def test_size_limit_on_bytes():
    with pytest.raises(ProjectFileError, match="larger than"):
        parse_bytes(b" " * (MAX_FILE_BYTES + 1))


def test_utf8_byte_order_mark_is_accepted():
    assert parse_bytes(b'\xef\xbb\xbf{"title": "x"}') == {"title": "x"}


def test_invalid_utf8_names_its_position():
    # 0xFF never occurs in UTF-8 (RFC 3629 §1)
    with pytest.raises(ProjectFileError, match=r"^line 2, column 12: not UTF-8 text \(byte 14 of the file\)"):
        parse_bytes(b'{\n "title": "\xff"}')
    # columns count characters, not bytes: "³" is two bytes in UTF-8
    with pytest.raises(ProjectFileError, match=r"^line 1, column 14: not UTF-8 text \(byte 15 of the file\)"):
        parse_bytes('{"title": "m³'.encode() + b'\xff"}')


def test_long_integer_literal_becomes_an_out_of_range_number():
    # Python refuses int() of more than 4300 digits with a ValueError that has no position
    assert parse_bytes(b'{"v": ' + b"9" * 5000 + b"}")["v"] == float("inf")


def test_nan_literal_is_left_for_validation_to_name():
    # NaN is not JSON (RFC 8259 §6) but Python's reader accepts it; validation then names the field
    assert parse_bytes(b'{"v": NaN}')["v"] != parse_bytes(b'{"v": NaN}')["v"]


def test_nothing_but_plain_data_comes_out():
    data = parse_bytes(b'{"a": [1, 2.5, "x", true, null, {"b": {}}]}')

    def kinds(v):
        if isinstance(v, dict):
            return {type(v)} | set().union(*(kinds(x) for x in v.values()))
        if isinstance(v, list):
            return {type(v)} | set().union(*(kinds(x) for x in v))
        return {type(v)}
    assert kinds(data) <= {dict, list, str, int, float, bool, type(None)}


@pytest.mark.parametrize("text, index", [("abc", 0), ("abc", 2), ("a\nbc", 3), ("a\n\nxyz", 5), ("\n", 1)])
def test_position_agrees_with_counting_lines(text, index):
    before = text[:index].split("\n")
    assert position(text, index) == (len(before), len(before[-1]) + 1)


def _largest(node):
    """The largest value the schema allows: every key, every list full, every text at its
    longest in 4-byte characters, every number with 17 significant digits."""
    from stagewright.core.project.schema_types import Changes, Choice, Items, Num, Obj, Raw, Text, Variant
    if isinstance(node, Changes):  # a case changing as many fields as it may, each a number
        return {f"stages[{i % 12}].cooler.coolant.glycol_fraction{'' if i < 12 else f'_{i}'}": -1.2345678901234567e-100
                for i in range(node.max_items)}
    if isinstance(node, Raw):  # the results snapshot: bounded by the cases, not by the schema
        return None
    if isinstance(node, Num):
        return 123456789 if node.integer else -1.2345678901234567e-100
    if isinstance(node, Choice):
        return max(node.options, key=len)
    if isinstance(node, Text):
        return "\U0001F600" * node.max_length
    if isinstance(node, Obj):
        return {k: _largest(v) for k, v in node.fields.items()}
    if isinstance(node, Variant):
        options = [{node.tag: kind, **{k: _largest(v) for k, v in fields.items()}}
                   for kind, fields in node.variants.items()]
        return max(options, key=lambda o: len(json.dumps(o)))
    if isinstance(node, Items):
        one = _largest(node.item)
        return [one] * node.max_length
    raise TypeError(node)


def test_the_largest_document_the_schema_allows_fits_the_limits():
    from stagewright.core.project import dumps
    from stagewright.core.project.schema import PROJECT
    data = dumps(_largest(PROJECT)).encode("utf-8")
    assert len(data) < MAX_FILE_BYTES / 2, f"{len(data)} bytes: raise MAX_FILE_BYTES"
    assert parse_bytes(data)["stages"][0]["name"].startswith("\U0001F600")  # and depth is within MAX_DEPTH


def test_unterminated_string_of_escaped_quotes_is_refused_in_linear_time():
    # issue 22 item 6: the depth scanner's regex retried the unterminated string from every
    # quote, 35 s for 60 kB; now one pass
    from tests.time_limit import finishes_within
    from stagewright.core.errors import ProjectFileError
    from stagewright.core.project.parse import parse_bytes

    data = b'{"title": "' + b'\\"' * 100_000
    with finishes_within(5.0, "refusing 200 kB of escaped quotes"):
        with pytest.raises(ProjectFileError, match="line 1, column 11"):
            parse_bytes(data)
    deep = b'{"title": "' + b'\\"' * 1000 + b'", "x": ' + b"[" * 40 + b"]" * 40 + b"}"
    with pytest.raises(ProjectFileError, match="nested more than"):
        parse_bytes(deep)  # brackets after a string full of escaped quotes are still counted


@pytest.mark.parametrize("depth", [MAX_DEPTH, MAX_DEPTH + 1])
def test_depth_limit_counts_brackets_outside_strings_only(depth):
    inside = '"' + "[" * 100 + '\\"{"'  # brackets in a string (with an escaped quote) do not nest
    text = '{"title": ' + inside + ', "x": ' + "[" * (depth - 1) + "]" * (depth - 1) + "}"
    if depth <= MAX_DEPTH:
        assert parse_bytes(text.encode())["title"] == "[" * 100 + '"{'
    else:
        with pytest.raises(ProjectFileError, match=f"line 1, column {len(text) - 2 * (depth - 1) - 1 + MAX_DEPTH}"):
            parse_bytes(text.encode())
