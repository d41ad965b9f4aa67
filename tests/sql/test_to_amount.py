# SPDX-License-Identifier: MIT
"""to_amount: money as exports write it, each case with the convention it follows.

Expected values are the amounts the text means by the convention named beside
it (common practice for grouping and decimal marks by country; accounting
parentheses for negatives). Errors are the exact texts; the rule behind each
is the README's "anything ambiguous is an error, never a guess".
"""
import sqlite3

import pytest

from conftest import connect

NBSP, THIN, NNBSP = "\u00a0", "\u2009", "\u202f"


def err(value, what):
    return f"to_amount(): argument 1 (text) = {value}: {what}"


GROUPS = "expected groups of three digits between grouping separators (1,234,567.89)"
COMMA_HINT = "; if ',' is the decimal mark, give ',' as decimal_mark"
POINT_HINT = "; if '.' is the decimal mark, give '.' as decimal_mark"

# (text, decimal_mark or None, expected amount or error text, convention)
CASES = [
    # US exports: '.' decimal, ',' thousands, '$' before
    ("1,050.00", None, 1050.0, "US"),
    ("$1,050.00", None, 1050.0, "US"),
    ("$ 1,050.00", None, 1050.0, "US"),
    ("-$12.50", None, -12.5, "US"),
    ("$-12.50", None, -12.5, "US"),
    ("USD 1,234,567.89", None, 1234567.89, "US, ISO 4217 code before"),
    ("1,234,567.89 USD", None, 1234567.89, "US, ISO 4217 code after"),
    ("US$99.95", None, 99.95, "US, prefixed dollar sign"),
    ("12", None, 12.0, "a whole amount"),
    ("0.99", None, 0.99, "US"),
    (".50", None, 0.5, "a bare fraction"),
    ("1050", None, 1050.0, "no grouping"),
    ("1,000,000", None, 1000000.0, "US, no decimals"),
    ("+5.00", None, 5.0, "an explicit plus"),
    # accounting parentheses
    ("(12.50)", None, -12.5, "accounting parentheses"),
    ("($1,050.00)", None, -1050.0, "accounting parentheses around the sign"),
    ("$(1,050.00)", None, -1050.0, "accounting parentheses after the sign"),
    ("(0.00)", None, 0.0, "a zero in parentheses is zero"),
    ("12.50-", None, -12.5, "trailing minus (older ledgers)"),
    ("\u22123.75", None, -3.75, "Unicode minus sign"),
    # UK exports: like US, with £
    ("£1,050.00", None, 1050.0, "UK"),
    ("-£0.40", None, -0.4, "UK"),
    ("GBP 2,000.10", None, 2000.1, "UK, ISO code"),
    ("£ 12", None, 12.0, "UK"),
    # German exports: ',' decimal, '.' thousands, € after
    ("1.050,00", ",", 1050.0, "German"),
    ("1.050,00 €", ",", 1050.0, "German"),
    ("1.050,00€", ",", 1050.0, "German"),
    ("-1.234.567,89 €", ",", -1234567.89, "German"),
    ("12,5", ",", 12.5, "German"),
    ("EUR 3,99", ",", 3.99, "German, ISO code"),
    ("0,01 EUR", ",", 0.01, "German"),
    ("1.000", ",", 1000.0, "German, grouping only"),
    # French exports: ',' decimal, (narrow) no-break or thin space thousands
    (f"1{NBSP}050,00{NBSP}€", ",", 1050.0, "French, no-break space"),
    (f"1{NNBSP}234{NNBSP}567,89 €", ",", 1234567.89, "French, narrow no-break space"),
    (f"1{THIN}050,00", ",", 1050.0, "French, thin space"),
    ("1 050,00 €", ",", 1050.0, "French, plain space"),
    ("-12,00 €", ",", -12.0, "French"),
    # Swiss exports: apostrophe thousands, '.' decimal
    ("CHF 1'050.00", None, 1050.0, "Swiss"),
    ("1'234'567.89", None, 1234567.89, "Swiss"),
    ("CHF -12.05", None, -12.05, "Swiss"),
    ("1\u2019050.00 CHF", None, 1050.0, "Swiss, typographic apostrophe"),
    # Indian-English exports: lakh grouping, '.' decimal
    ("1,05,000.00", None, 105000.0, "Indian English, lakh grouping"),
    ("12,34,56,789.50", None, 123456789.5, "Indian English, crore grouping"),
    ("\u20b91,05,000", None, 105000.0, "Indian English, rupee sign"),
    ("Rs. 1,050.00", None, 1050.0, "Indian English, Rs."),
    ("INR 99,999.00", None, 99999.0, "Indian English, ISO code"),
    # NULL rules (SQL conventions; README: the empty string gives NULL)
    ("", None, None, "empty"),
    ("   ", None, None, "all spaces"),
    # errors: ambiguous or malformed
    ("1,05.00", None, err("'1,05.00'", "at character 2 (','): " + GROUPS), "a group of two"),
    ("12.3.4", None, err("'12.3.4'", "at character 5 ('.'): expected one decimal mark '.', found a second"), "two marks"),
    ("12,5", None, err("'12,5'", "at character 3 (','): " + GROUPS + COMMA_HINT), "German text, US mark"),
    ("1.050,00", None, err("'1.050,00'", "at character 6 (','): expected only digits after the decimal mark '.'" + COMMA_HINT), "German text, US mark"),
    ("1,050.00", ",", err("'1,050.00'", "at character 6 ('.'): expected only digits after the decimal mark ','" + POINT_HINT), "US text, German mark"),
    ("--5", None, err("'--5'", "expected at most one sign (a minus, or parentheses), found 2"), "two signs"),
    ("-(5.00)", None, err("'-(5.00)'", "expected at most one sign (a minus, or parentheses), found 2"), "two signs"),
    ("-5-", None, err("'-5-'", "expected at most one sign (a minus, or parentheses), found 2"), "two signs"),
    ("twelve", None, err("'twelve'", "at character 1 ('t'): expected digits, a grouping separator or the decimal mark '.'"), "a word"),
    ("12 apples", None, err("'12 apples'", "at character 4 ('a'): expected digits after a grouping separator"), "a word after"),
    ("$", None, err("'$'", "expected digits"), "a sign alone"),
    ("USD EUR 5", None, err("'USD EUR 5'", "expected at most one currency sign or code"), "two currencies"),
    ("1,000 000", None, err("'1,000 000'", "at character 6 (' '): expected one kind of grouping separator, found ',' and a space"), "mixed separators"),
    ("12.", None, err("'12.'", "expected digits after the decimal mark '.'"), "a mark without digits"),
    ("1e5", None, err("'1e5'", "at character 2 ('e'): expected digits, a grouping separator or the decimal mark '.'"), "scientific notation is not money"),
    ("0,500", None, err("'0,500'", "at character 1 ('0'): expected no leading zero before a grouping separator" + COMMA_HINT), "leading zero"),
    ("1,,000", None, err("'1,,000'", "at character 3 (','): expected digits after a grouping separator"), "doubled separator"),
    ("1,234.5,6", None, err("'1,234.5,6'", "at character 8 (','): expected only digits after the decimal mark '.'" + COMMA_HINT), "separator after the mark"),
    ("(12.50", None, err("'(12.50'", "at character 1 ('('): expected digits, a grouping separator or the decimal mark '.'"), "unclosed parenthesis"),
    ("1 05", None, err("'1 05'", "at character 2 (' '): " + GROUPS), "a space group of two"),
]


@pytest.mark.parametrize("text,mark,expected,convention", CASES, ids=[f"{c[3]}:{c[0]}" for c in CASES])
def test_to_amount_case(text, mark, expected, convention):
    db = connect()
    sql = "SELECT to_amount(?)" if mark is None else "SELECT to_amount(?, ?)"
    args = (text,) if mark is None else (text, mark)
    if isinstance(expected, str):
        with pytest.raises(sqlite3.OperationalError) as error:
            db.execute(sql, args).fetchone()
        assert str(error.value) == expected  # the exact text, pinned (README: ambiguous is an error)
    else:
        got = db.execute(sql, args).fetchone()[0]
        # common practice: the amount the convention named beside the case writes
        assert got == expected and (got is None or type(got) is float)


def test_the_table_has_at_least_sixty_cases():
    assert len(CASES) >= 60  # the minimum
    print(f"\ncompared: {len(CASES)} to_amount cases")


def test_numbers_pass_through_unchanged():
    db = connect()
    # README: INTEGER and REAL pass through
    assert db.execute("SELECT to_amount(12), typeof(to_amount(12))").fetchone() == (12, "integer")
    assert db.execute("SELECT to_amount(12.5), typeof(to_amount(12.5))").fetchone() == (12.5, "real")
    assert db.execute("SELECT to_amount(NULL), to_amount('1,0', NULL)").fetchone() == (None, None)
