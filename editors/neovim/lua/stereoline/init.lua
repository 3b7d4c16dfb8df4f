-- Stereoline for Neovim's built-in LSP client.
--
-- Works on Neovim 0.7 (vim.lsp.start_client plus autocmds: vim.lsp.start
-- arrived in 0.8) and on newer versions, where vim.lsp.start is used so
-- Neovim itself reuses one server per root directory.
--
--   require("stereoline").setup({
--     cmd = { "stereoline", "serve" },
--     settings = { inlayHints = true, severity = { ["stereo-undefined"] = "off" } },
--   })
local M = {}

-- The settings section the server reads, in initializationOptions and in
-- workspace/configuration.
M.section = "stereoline"

M.defaults = {
  cmd = { "stereoline", "serve" },
  -- Filetypes whose buffers go to the server. "smiles" is set below for
  -- .smi, .smiles and .rsmi files.
  filetypes = {
    "smiles", "python", "csv", "tsv", "markdown", "jsonl", "json", "yaml",
    "javascript", "javascriptreact", "typescript", "typescriptreact",
    "go", "r", "julia", "rust", "java", "kotlin", "rmd", "quarto", "rst",
  },
  -- Files or directories that mark a project root, searched upwards.
  root_markers = { ".git", "pyproject.toml", "setup.py" },
  -- The server's settings: severity, inlayHints, drawingLens, detection,
  -- columns, names, files.
  settings = {},
  -- Called as on_attach(client, bufnr) after a buffer is attached.
  on_attach = nil,
  -- Called as on_exit(code, signal, client_id) when the server stops.
  on_exit = nil,
}

local config = vim.deepcopy(M.defaults)
-- vim.uv replaced vim.loop in 0.10.
local uv = vim.uv or vim.loop
-- clients maps a root directory to a client id (Neovim 0.7 only).
local clients = {}

-- find_root walks up from a buffer's directory to the first directory
-- holding one of the markers, falling back to the buffer's directory.
local function find_root(bufnr)
  local name = vim.api.nvim_buf_get_name(bufnr)
  local dir = name ~= "" and vim.fn.fnamemodify(name, ":p:h") or vim.fn.getcwd()
  local cur = dir
  while true do
    for _, marker in ipairs(config.root_markers) do
      if uv.fs_stat(cur .. "/" .. marker) then
        return cur
      end
    end
    local parent = vim.fn.fnamemodify(cur, ":h")
    if parent == cur then
      return dir
    end
    cur = parent
  end
end

local function on_attach(client, bufnr)
  -- Inlay hints exist from Neovim 0.10 on; the call's signature changed
  -- during 0.10's development, hence pcall.
  local ih = vim.lsp.inlay_hint
  if config.settings.inlayHints ~= false and type(ih) == "table" and ih.enable then
    pcall(ih.enable, true, { bufnr = bufnr })
  end
  if config.on_attach then
    config.on_attach(client, bufnr)
  end
end

-- client_config builds the configuration handed to Neovim for a root.
local function client_config(root)
  return {
    name = "stereoline",
    cmd = config.cmd,
    root_dir = root,
    workspace_folders = { { uri = vim.uri_from_fname(root), name = root } },
    init_options = config.settings,
    -- Neovim answers workspace/configuration from this table by section.
    settings = { [M.section] = config.settings },
    offset_encoding = "utf-16",
    flags = { debounce_text_changes = 150 },
    on_attach = on_attach,
    on_exit = config.on_exit,
  }
end

-- attach starts (or reuses) the server for a buffer's root and attaches
-- the buffer. It returns the client id, or nil when the server could not
-- be started.
function M.attach(bufnr)
  bufnr = (bufnr == nil or bufnr == 0) and vim.api.nvim_get_current_buf() or bufnr
  local root = find_root(bufnr)
  if vim.lsp.start then
    return vim.lsp.start(client_config(root), { bufnr = bufnr })
  end
  local id = clients[root]
  local client = id and vim.lsp.get_client_by_id(id)
  if not client or client.is_stopped() then
    id = vim.lsp.start_client(client_config(root))
    if not id then
      return nil
    end
    clients[root] = id
  end
  vim.lsp.buf_attach_client(bufnr, id)
  return id
end

-- setup merges opts into the defaults, teaches Neovim the list-file
-- extensions and attaches every matching buffer, now and later.
function M.setup(opts)
  config = vim.tbl_deep_extend("force", vim.deepcopy(M.defaults), opts or {})
  local group = vim.api.nvim_create_augroup("stereoline", { clear = true })
  -- List files: Neovim's own detection takes *.smi for an SNMP MIB, so
  -- the filetype is set, not merely suggested. Tables: Neovim 0.7 knows
  -- no csv or tsv filetype; setfiletype leaves one another plugin chose.
  vim.api.nvim_create_autocmd({ "BufRead", "BufNewFile" }, {
    group = group,
    pattern = { "*.smi", "*.smiles", "*.rsmi" },
    command = "set filetype=smiles",
  })
  vim.api.nvim_create_autocmd({ "BufRead", "BufNewFile" }, {
    group = group,
    pattern = "*.csv",
    command = "setfiletype csv",
  })
  vim.api.nvim_create_autocmd({ "BufRead", "BufNewFile" }, {
    group = group,
    pattern = { "*.tsv", "*.tab" },
    command = "setfiletype tsv",
  })
  -- JSON Lines datasets: the server reads the language "jsonl" line by
  -- line; the type is set, as another detection may call them JSON.
  vim.api.nvim_create_autocmd({ "BufRead", "BufNewFile" }, {
    group = group,
    pattern = { "*.jsonl", "*.ndjson" },
    command = "set filetype=jsonl",
  })
  vim.api.nvim_create_autocmd("FileType", {
    group = group,
    pattern = config.filetypes,
    callback = function(args)
      M.attach(args.buf)
    end,
  })
  -- Buffers opened before setup ran.
  for _, buf in ipairs(vim.api.nvim_list_bufs()) do
    if vim.api.nvim_buf_is_loaded(buf) and vim.tbl_contains(config.filetypes, vim.bo[buf].filetype) then
      M.attach(buf)
    end
  end
end

-- settings_changed sends new settings to every running server, for a
-- user who changes them after setup.
function M.settings_changed(settings)
  config.settings = vim.tbl_deep_extend("force", config.settings, settings or {})
  -- get_clients replaced get_active_clients in 0.10, and client methods
  -- are called with ':' from 0.11 on.
  local list = vim.lsp.get_clients and vim.lsp.get_clients({ name = "stereoline" }) or vim.lsp.get_active_clients()
  local colon = vim.fn.has("nvim-0.11") == 1
  for _, client in ipairs(list) do
    if client.name == "stereoline" then
      client.config.settings = { [M.section] = config.settings }
      local params = { settings = client.config.settings }
      if colon then
        client:notify("workspace/didChangeConfiguration", params)
      else
        client.notify("workspace/didChangeConfiguration", params)
      end
    end
  end
end

return M
