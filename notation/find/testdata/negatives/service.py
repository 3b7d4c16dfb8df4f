"""Inventory service: ordinary Python with element-like words, paths,
regexes, versions and dates. Nothing here is line notation."""

import argparse
import csv
import datetime as dt
import json
import logging
import os
import re
import sys
from pathlib import Path

__version__ = "2.4.1"
LOG = logging.getLogger("inventory")

STATES = ("CO", "NO", "OK", "CA", "NY", "TX", "IN", "OR", "SC", "NC", "PA")
UNITS = {"C": "celsius", "F": "fahrenheit", "K": "kelvin"}
COLOURS = ["#FF0000", "#C0C0C0", "#00FF00", "#0000FF"]
STATUS_OK = "OK"
NOT_AVAILABLE = "N/A"
IO_LABEL = "I/O"
SIGNAL_NOISE = "S/N"
DATE_FORMATS = ["%Y-%m-%d", "%d/%m/%Y", "%m/%d/%Y %H:%M"]
TIMEOUT = "30s"
STYLE_SHEETS = ["main.scss", "SCSS", "LESS", "CSS"]
ISO_PATTERN = re.compile(r"^\d{4}-\d{2}-\d{2}$")
PHONE = re.compile("[0-9]{3}-[0-9]{4}")
SLUG = re.compile(r"[^a-z0-9/]+")
BACKSLASH_PATH = "C:\\Users\\Public\\Documents"
UNIX_PATH = "/usr/local/share/inventory"
RELATIVE = "../data/raw"
URL = "https://example.org/api/v2/items?page=1&size=50"
ENDPOINT = "api/v2/items"
MIME = "application/json"
HEADER = "Content-Type"
CHESS = ["Nf3", "O-O", "Bxc6", "e4", "Qh5"]
CODES = ["C3PO", "R2D2", "B12", "A1:C10", "I18N", "K8S", "CO2", "H2O", "NO2", "SO4"]
LOG_PREFIXES = ["[OK]", "[INFO]", "[WARN]", "[ERROR]", "[N]", "[C]"]
RATIOS = ["1/2", "3/4", "P/E", "B/C", "24/7", "and/or", "w/o", "TCP/IP", "C/C++"]
COBALT = "Co"
CHLORINE = "Cl"
CARBON = "C"


def parse_args(argv=None):
    p = argparse.ArgumentParser(prog="inventory", description="Keep stock levels.")
    p.add_argument("--input", default="stock.csv", help="CSV file with the stock")
    p.add_argument("--since", default="2024/01/31", help="first day (YYYY/MM/DD)")
    p.add_argument("--format", choices=["json", "csv", "text"], default="text")
    p.add_argument("-v", "--verbose", action="store_true")
    return p.parse_args(argv)


class Item:
    """One stock item."""

    def __init__(self, sku, name, qty, location="A1"):
        self.sku = sku
        self.name = name
        self.qty = int(qty)
        self.location = location

    def __repr__(self):
        return f"Item({self.sku!r}, {self.name!r}, {self.qty})"

    def label(self):
        return "%s/%s" % (self.location, self.sku)

    def is_low(self, threshold=5):
        return self.qty < threshold


def read_stock(path):
    items = []
    with open(path, newline="") as fh:
        for row in csv.DictReader(fh):
            if row.get("status") == "N/A":
                continue
            items.append(Item(row["sku"], row["name"], row["qty"], row.get("loc", "B2")))
    return items


def summarise(items):
    low = [i for i in items if i.is_low()]
    LOG.info("read %d items, %d low", len(items), len(low))
    return {"total": len(items), "low": len(low), "version": __version__}


def to_text(summary):
    lines = ["Inventory report", "=" * 16]
    for key in ("total", "low"):
        lines.append("%-8s %5d" % (key, summary[key]))
    lines.append("status: " + STATUS_OK)
    return "\n".join(lines)


def temperature(value, unit="C"):
    if unit == "C":
        return value
    if unit == "F":
        return (value - 32) * 5 / 9
    if unit == "K":
        return value - 273.15
    raise ValueError("unknown unit %r" % unit)


def normalise_path(p):
    p = p.replace("\\", "/")
    if p.startswith("./"):
        p = p[2:]
    return os.path.normpath(p)


def backup_name(now=None):
    now = now or dt.datetime.now()
    return now.strftime("backup-%Y%m%d-%H%M%S.tar.gz")


def route(method, path):
    table = {
        ("GET", "/items"): "list",
        ("POST", "/items"): "create",
        ("GET", "/items/<id>"): "show",
        ("DELETE", "/items/<id>"): "delete",
    }
    return table.get((method, path), "not-found")


def main(argv=None):
    args = parse_args(argv)
    logging.basicConfig(level=logging.DEBUG if args.verbose else logging.INFO)
    path = Path(args.input)
    if not path.exists():
        print("no such file: %s" % path, file=sys.stderr)
        return 2
    summary = summarise(read_stock(path))
    if args.format == "json":
        print(json.dumps(summary, indent=2))
    else:
        print(to_text(summary))
    return 0


TEMPLATES = {
    "greeting": "Hello, {name}!",
    "bye": "Goodbye/Au revoir",
    "path": "{root}/{sub}/{file}",
    "ldap": "CN=admin,O=Example,C=GB",
    "sql": "SELECT * FROM items WHERE qty < 5",
    "cron": "*/5 * * * *",
    "semver": "^1.2.3 || ~2.0",
    "hash": "sha256:9f86d081884c7d65",
    "b64": "SGVsbG8sIHdvcmxkIQ==",
    "uuid": "123e4567-e89b-12d3-a456-426614174000",
    "ratio": "16/9",
    "excel": "=SUM(B2:B10)",
    "time": "12:30:00",
}

if __name__ == "__main__":
    sys.exit(main())


def report_lines(items, year, width=12):
    """Formatted output: templates full of paths, ranges and codes."""
    out = [f"{'SKU':<{width}} {'NAME':^20} {'QTY':>6}"]
    for it in items:
        out.append(f"{it.sku:<{width}} {it.name!s:^20} {it.qty:>6d}")
        out.append(f"  see data/{year}/C1/report.csv or B2:B10 at 12:30:00\n")
        out.append(f"  cell A1:C10 = {it.total:.2f} (H2O, CO2, C3PO) N/A I/O")
        out.append(f"  C:\\Data\\{it.sku}.csv and /usr/local/{it.name}/bin")
    out.append(f"{{total}} {len(items)} items on {year}/01/31, v1.2.3, 10.0.0.1")
    out.append(f"{sum(i.qty for i in items)=} {items[0].tags["color"]!r}")
    out.append(t"{year} {width} 50-00-0 7732-18-5")
    out.append(f"""
Summary for {year}:
    {len(items)} items, ratio {year}/{width}, code C{year}N
    ratio 16/9, 4/3 and 1/2; path a/b/c
""")
    return "\n".join(out)


def legacy_report(items):
    """Old-style formatting: fields and percent signs are not notation."""
    lines = ["%-12s %6d %5.1f%%" % (i.sku, i.qty, i.share) for i in items]
    lines.append("%(sku)s/%(loc)s C%(n)dN" % {"sku": "B12", "loc": "C1", "n": 2})
    lines.append("{}/{} at {:%Y/%m/%d} ratio {0:.2f}/{1}".format(a, b, when, x, y))
    lines.append("100% done, C1/B2 %s" % "ok")
    return "\n".join(lines)


# Settings of a sync client; SmartSyncPolicy and friends are no patterns.
SmartSyncPolicy.local = SmartSyncPolicy("local")
sma = compute_sma("close", window=20)
routine_rules = {"return": "return;", "append": "flen(#varname#),", "format": "O!"}
req_template = """
    [req]
    distinguished_name = req_dn
    DNS.1 = {hostname}
"""
banner = "A!\n" + "CN\tNO\r\n"
