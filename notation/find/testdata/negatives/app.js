// A small web client: ordinary JavaScript, nothing here is notation.
'use strict';

const API = "https://example.org/api/v1";
const VERSION = "3.1.4";
const STATES = ["CO", "NO", "OK", "IN", "OR"];
const LEVELS = { C: "critical", N: "notice", I: "info", S: "silent" };
const NA = "N/A";
const IO = "I/O";
const ROUTES = ["/", "/about", "/items/:id", "/items/:id/edit"];
const DATE = "2024/02/29";
const SLASHES = /\/+/g;
const QUOTE = /["']/;
const EMAIL = /^[^@\s]+@[^@\s]+\.[a-z]{2,}$/i;
const ratio = 16 / 9 / 2;
const paths = ["src/index.js", "./lib/util.js", "../assets/logo.png", "C:\\tmp\\out"];
const mimes = ["text/html", "image/png", "application/ld+json"];
const chess = ["Nf3", "O-O-O", "Bxc6+", "e8=Q"];
const codes = ["C3PO", "B12", "CO2", "H2O", "A1:B2", "I18N"];
const tags = ["[OK]", "[C]", "[N]", "[INFO]"];
const styles = ["SCSS", "Sass", "CSS", "LESS"];

function buildUrl(path, params) {
  const q = Object.entries(params || {})
    .map(([k, v]) => encodeURIComponent(k) + "=" + encodeURIComponent(v))
    .join("&");
  return API + path + (q ? "?" + q : "");
}

async function fetchItems(page = 1) {
  const res = await fetch(buildUrl("/items", { page, size: 50 }), {
    headers: { "Content-Type": "application/json", Accept: "application/json" },
  });
  if (!res.ok) {
    throw new Error(`request failed: ${res.status} ${res.statusText}`);
  }
  return res.json();
}

function formatDate(d) {
  const pad = (n) => String(n).padStart(2, "0");
  return `${d.getFullYear()}/${pad(d.getMonth() + 1)}/${pad(d.getDate())}`;
}

function slugify(s) {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "");
}

class Cart {
  constructor() {
    this.items = new Map();
  }
  add(sku, qty = 1) {
    this.items.set(sku, (this.items.get(sku) || 0) + qty);
    return this;
  }
  remove(sku) {
    this.items.delete(sku);
    return this;
  }
  get size() {
    let n = 0;
    for (const q of this.items.values()) n += q;
    return n;
  }
  toString() {
    return [...this.items].map(([k, v]) => k + " x" + v).join(", ");
  }
}

function temperature(value, unit) {
  switch (unit) {
    case "C":
      return value;
    case "F":
      return ((value - 32) * 5) / 9;
    case "K":
      return value - 273.15;
    default:
      return NaN;
  }
}

const messages = {
  empty: "Your cart is empty.",
  full: "Free delivery over 50/month",
  help: "Use Ctrl+C / Cmd+C to copy",
  path: "Saved to ~/Downloads/report.pdf",
  and: "and/or",
  cron: "0 */6 * * *",
};

module.exports = { buildUrl, fetchItems, formatDate, slugify, Cart, temperature, messages };

function summary(items, year) {
  const head = `${"SKU".padEnd(12)} ${"NAME"} total ${items.length}`;
  const path = `data/${year}/C1/report.csv and B2:B10 at 12:30:00\n`;
  const codes = `${items[0].sku} H2O CO2 C3PO N/A I/O v1.2.3 10.0.0.1 ${year}/01/31`;
  const nested = `${items.map((i) => `${i.sku}/${i.qty}`).join(", ")} ratio 16/9`;
  return [head, path, codes, nested].join("\n");
}
