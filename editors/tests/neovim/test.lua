-- Drives Neovim's built-in LSP client, through the set-up in
-- editors/neovim, against `stereoline serve`: it opens a Python file and a
-- .smi list, waits for the pushed diagnostics, checks the hover text,
-- applies the mirror rewrite and a quick fix, writes the buffers, compares
-- them with golden files and checks that the server exits with status 0
-- after shutdown and exit (LSP 3.17, "exit": 0 if shutdown came first).
--
-- Run: nvim --headless -u NONE -i NONE -n --cmd 'set rtp^=editors/neovim' \
--        -c 'luafile editors/tests/neovim/test.lua'
-- with STEREOLINE_BIN (the server binary), STEREOLINE_WORK (a scratch
-- copy of the fixtures, written to) and STEREOLINE_FIXTURES (the golden
-- files). Each check prints "ok" or "not ok"; the exit status is the
-- number of failed checks.
local bin = assert(os.getenv("STEREOLINE_BIN"), "STEREOLINE_BIN not set")
local work = assert(os.getenv("STEREOLINE_WORK"), "STEREOLINE_WORK not set")
local fixtures = assert(os.getenv("STEREOLINE_FIXTURES"), "STEREOLINE_FIXTURES not set")

local failed = 0
local function check(ok, what, detail)
  if ok then
    io.stdout:write("  ok     " .. what .. "\n")
  else
    failed = failed + 1
    io.stdout:write("  not ok " .. what .. (detail and (": " .. detail) or "") .. "\n")
  end
  return ok
end

local function read(path)
  local f = io.open(path, "rb")
  if not f then
    return nil
  end
  local s = f:read("*a")
  f:close()
  return s
end

local exit_code, exit_signal
local sl = require("stereoline")
vim.cmd("filetype on")
sl.setup({
  cmd = { bin, "serve" },
  settings = { inlayHints = true },
  on_exit = function(code, signal)
    exit_code, exit_signal = code, signal
  end,
})

local function client_of(buf)
  for _, c in pairs(vim.lsp.buf_get_clients(buf)) do
    if c.name == "stereoline" then
      return c
    end
  end
end

-- wait_diagnostics waits until the buffer has at least n diagnostics from
-- the server (pushed with textDocument/publishDiagnostics).
local function wait_diagnostics(buf, n)
  vim.wait(10000, function()
    return #vim.diagnostic.get(buf) >= n
  end, 20)
  return vim.diagnostic.get(buf)
end

local function find_diag(diags, code)
  for _, d in ipairs(diags) do
    if d.code == code then
      return d
    end
  end
end

-- position returns the 0-based line and UTF-16 column of the first match
-- of a plain string in the buffer (the fixtures are ASCII, so bytes and
-- UTF-16 units agree).
local function position(buf, text)
  for i, line in ipairs(vim.api.nvim_buf_get_lines(buf, 0, -1, false)) do
    local col = line:find(text, 1, true)
    if col then
      return { line = i - 1, character = col - 1 }
    end
  end
end

local function request(buf, method, params)
  local res, err = vim.lsp.buf_request_sync(buf, method, params, 5000)
  if not res then
    return nil, err
  end
  for _, r in pairs(res) do
    if r.error then
      return nil, vim.inspect(r.error)
    end
    return r.result
  end
end

local function hover_text(buf, pos)
  local r = request(buf, "textDocument/hover", {
    textDocument = { uri = vim.uri_from_bufnr(buf) },
    position = pos,
  })
  if not r or not r.contents then
    return ""
  end
  local c = r.contents
  if type(c) == "string" then
    return c
  end
  if c.value then
    return c.value
  end
  local parts = {}
  for _, p in ipairs(c) do
    parts[#parts + 1] = type(p) == "string" and p or p.value
  end
  return table.concat(parts, "\n")
end

-- apply_action asks for code actions at a range, picks the first for
-- which pick(action) is true, resolves it if it has no edit yet
-- (codeAction/resolve) and applies its workspace edit.
local function apply_action(buf, range, context, pick)
  local actions = request(buf, "textDocument/codeAction", {
    textDocument = { uri = vim.uri_from_bufnr(buf) },
    range = range,
    context = context,
  }) or {}
  local chosen
  for _, a in ipairs(actions) do
    if pick(a) then
      chosen = a
      break
    end
  end
  if not chosen then
    local titles = {}
    for _, a in ipairs(actions) do
      titles[#titles + 1] = (a.kind or "?") .. " " .. (a.title or "?")
    end
    return false, "no matching action among: " .. table.concat(titles, "; ")
  end
  if not chosen.edit then
    local client = client_of(buf)
    local r = client and client.request_sync("codeAction/resolve", chosen, 5000, buf)
    if not r or r.err or not r.result then
      return false, "codeAction/resolve failed: " .. vim.inspect(r and r.err)
    end
    chosen = r.result
  end
  if not chosen.edit then
    return false, "resolved action has no edit"
  end
  vim.lsp.util.apply_workspace_edit(chosen.edit, "utf-16")
  return true
end

-- lsp_diags turns vim.diagnostic entries back into LSP diagnostics for a
-- code action context. Neovim 0.7 keeps only the code and tags of the
-- original in user_data.lsp, so the range comes from the entry itself
-- (byte columns: the fixtures are ASCII, where bytes and UTF-16 agree).
local function lsp_diags(diags)
  local out = {}
  for _, d in ipairs(diags) do
    local orig = (d.user_data and d.user_data.lsp) or {}
    out[#out + 1] = {
      range = { start = { line = d.lnum, character = d.col }, ["end"] = { line = d.end_lnum, character = d.end_col } },
      message = d.message,
      code = d.code or orig.code,
      severity = d.severity,
      source = d.source,
      tags = orig.tags,
    }
  end
  return out
end

local function golden(buf, name)
  vim.api.nvim_buf_call(buf, function()
    vim.cmd("silent write")
  end)
  local have, want = read(work .. "/" .. name), read(fixtures .. "/" .. name .. ".golden")
  check(have ~= nil and have == want, name .. ": written buffer equals " .. name .. ".golden",
    "have:\n" .. tostring(have) .. "\nwant:\n" .. tostring(want))
end

local function range_at(pos, len)
  return { start = pos, ["end"] = { line = pos.line, character = pos.character + len } }
end

-- mirror applies the mirror rewrite at the lactate mark.
local function mirror(buf, pos)
  local ok, why = apply_action(buf, range_at(pos, 2), { diagnostics = {}, only = { "refactor.rewrite.stereo.mirror" } },
    function(a)
      return a.kind == "refactor.rewrite.stereo.mirror"
    end)
  check(ok, "mirror action applied on the lactate record", why)
end

-- main runs the checks; an error in it (a Lua error, not a failed check)
-- must still end Neovim, or the headless run would wait forever.
local function main()
  -- Python file ------------------------------------------------------------
  io.stdout:write("python file\n")
  vim.cmd("edit " .. vim.fn.fnameescape(work .. "/sample.py"))
  local py = vim.api.nvim_get_current_buf()
  check(vim.bo[py].filetype == "python", "sample.py has filetype python", vim.bo[py].filetype)
  vim.wait(5000, function()
    return client_of(py) ~= nil
  end, 20)
  check(client_of(py) ~= nil, "the set-up attached stereoline to the Python buffer")
  local diags = wait_diagnostics(py, 2)
  -- Python's lexical rules: "\F" is not a recognised escape, so the string
  -- does not hold the backslash as written (Python Language Reference,
  -- lexical analysis, string literals).
  local esc = find_diag(diags, "host-escape")
  check(esc and esc.lnum == 3, "diagnostic host-escape on line 4 (the plain-string backslash)", vim.inspect(diags))
  -- IUPAC 2013 P-92: a centre with two identical ligands (two methyl
  -- groups) is not a stereocentre, so its mark is without effect.
  local odd = find_diag(diags, "stereo-ineffective-center")
  check(odd and odd.lnum == 6, "diagnostic stereo-ineffective-center on line 7 (two methyl groups)", vim.inspect(diags))

  -- (R)-lactic acid: worked by hand from the CIP rules (IUPAC 2013 P-92):
  -- O > COOH > CH3 > H; C[C@@H](O)C(=O)O reads clockwise with H away.
  -- Hill formula C3H6O3 (common practice, lactic acid).
  local mark = position(py, "@@")
  local hv = hover_text(py, mark)
  check(hv:find("(R)", 1, true) ~= nil, "hover on the lactate mark says (R)", hv)
  check(hv:find("C3H6O3", 1, true) ~= nil, "hover on the lactate mark gives the formula C3H6O3", hv)

  -- OpenSMILES specification, tetrahedral centres: swapping @@ for @
  -- inverts the centre, so the mirror of lactate is C[C@H](O)C(=O)O.
  mirror(py, mark)
  -- Python Language Reference, string literals: in a raw string the backslash stays as written.
  local esc_lsp = lsp_diags({ esc })[1]
  local ok, why = apply_action(py, esc_lsp and esc_lsp.range or range_at(position(py, "\\F"), 2),
    { diagnostics = { esc_lsp }, only = { "quickfix" } },
    function(a)
      return a.kind == "quickfix" and a.title:find("raw") ~= nil
    end)
  check(ok, "quick fix 'raw string' applied on the alkene", why)
  golden(py, "sample.py")

  -- List file --------------------------------------------------------------
  io.stdout:write("list file\n")
  vim.cmd("edit " .. vim.fn.fnameescape(work .. "/sample.smi"))
  local smi = vim.api.nvim_get_current_buf()
  check(vim.bo[smi].filetype == "smiles", "sample.smi has filetype smiles", vim.bo[smi].filetype)
  -- The set-up's syntax file: token classes after the OpenSMILES
  -- specification (chirality mark, direction mark, atom, title).
  vim.cmd("syntax enable")
  local function syn_at(text, offset)
    local p = position(smi, text)
    if not p then
      return "no " .. text
    end
    return vim.fn.synIDattr(vim.fn.synID(p.line + 1, p.character + 1 + (offset or 0), 1), "name")
  end
  local syn = {
    { "@@", 0, "smilesChirality" },
    { "F/C=C/F", 1, "smilesStereo" },
    { "F/C=C/F", 2, "smilesAtom" },
    { "F/C=C/F", 3, "smilesBond" },
    { "lactate-demo", 0, "smilesTitle" },
    { "# Invented", 0, "smilesComment" },
  }
  for _, c in ipairs(syn) do
    local have = syn_at(c[1], c[2])
    check(have == c[3], string.format("syntax at %q+%d is %s", c[1], c[2], c[3]), have)
  end
  vim.wait(5000, function()
    return client_of(smi) ~= nil
  end, 20)
  check(client_of(smi) ~= nil, "the set-up attached stereoline to the list buffer")
  diags = wait_diagnostics(smi, 2)
  odd = find_diag(diags, "stereo-ineffective-center")
  -- CC[C@H](C)C: the centre carries two methyl groups (IUPAC 2013 P-92).
  check(odd and odd.lnum == 3, "diagnostic stereo-ineffective-center on line 4", vim.inspect(diags))
  -- F/C=CCl: a direction mark on one side of the double bond only leaves its
  -- configuration open (OpenSMILES
  -- specification, cis/trans double bonds).
  local one = find_diag(diags, "stereo-one-sided-bond")
  check(one and one.lnum == 4, "diagnostic stereo-one-sided-bond on line 5", vim.inspect(diags))
  mark = position(smi, "@@")
  hv = hover_text(smi, mark)
  check(hv:find("(R)", 1, true) ~= nil, "hover on the lactate mark says (R)", hv)
  check(hv:find("C3H6O3", 1, true) ~= nil, "hover on the lactate mark gives the formula C3H6O3", hv)
  -- OpenSMILES specification, cis/trans double bonds: F/C=C/F is trans;
  -- with F the higher ligand on each carbon that is (E) (IUPAC 2013 P-93).
  local bond = position(smi, "F/C=C/F")
  hv = hover_text(smi, { line = bond.line, character = bond.character + 3 })
  check(hv:find("(E)", 1, true) ~= nil, "hover on the difluoroethene double bond says (E)", hv)
  mirror(smi, mark)

  -- Settings changed after start-up reach the server under the
  -- "stereoline" section: switching a code off removes its diagnostic.
  sl.settings_changed({ severity = { ["stereo-one-sided-bond"] = "off" } })
  vim.wait(5000, function()
    return find_diag(vim.diagnostic.get(smi), "stereo-one-sided-bond") == nil
  end, 20)
  diags = vim.diagnostic.get(smi)
  odd = find_diag(diags, "stereo-ineffective-center")
  check(find_diag(diags, "stereo-one-sided-bond") == nil and odd ~= nil,
    "severity off for stereo-one-sided-bond removes only that diagnostic", vim.inspect(diags))

  -- The quick fix of the ineffective mark drops it: CC[C@H](C)C becomes
  -- CCC(C)C, the same compound, since an organic-subset C with three
  -- bonds carries one implicit hydrogen, as [C@H] did (OpenSMILES,
  -- implicit hydrogens).
  local odd_lsp = lsp_diags({ odd })[1]
  ok, why = apply_action(smi, odd_lsp and odd_lsp.range or range_at(position(smi, "[C@H]"), 5),
    { diagnostics = { odd_lsp }, only = { "quickfix" } },
    function(a)
      return a.kind == "quickfix" and a.title:find("remove") ~= nil
    end)
  check(ok, "quick fix 'remove the mark' applied on the ineffective record", why)
  golden(smi, "sample.smi")

  -- JSON Lines dataset ------------------------------------------------------
  io.stdout:write("json lines\n")
  vim.cmd("edit " .. vim.fn.fnameescape(fixtures .. "/sample.jsonl"))
  local jl = vim.api.nvim_get_current_buf()
  check(vim.bo[jl].filetype == "jsonl", "sample.jsonl has filetype jsonl", vim.bo[jl].filetype)
  -- the second record is the mirror image of the first (OpenSMILES: @
  -- and @@ are mirror images)
  local jd = wait_diagnostics(jl, 1)
  check(find_diag(jd, "list-enantiomer") ~= nil, "sample.jsonl: list-enantiomer on its second line", vim.inspect(jd))

  -- Shutdown ----------------------------------------------------------------
  io.stdout:write("shutdown\n")
  local client = client_of(smi)
  if client then
    client.stop()
    vim.wait(5000, function()
      return exit_code ~= nil
    end, 20)
  end
  check(exit_code == 0 and (exit_signal or 0) == 0, "server exited with status 0 after shutdown and exit",
    "code " .. tostring(exit_code) .. ", signal " .. tostring(exit_signal))
end

local ok_main, err = xpcall(main, debug.traceback)
if not ok_main then
  check(false, "the test script ran to the end", err)
end

if failed == 0 then
  vim.cmd("qall!")
else
  vim.cmd("cquit " .. failed)
end
