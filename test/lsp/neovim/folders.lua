-- Drives `tickmark lsp --stdio` from Neovim 0.7 with two workspace folders whose `tickmark` settings differ, as a
-- multi-root editor answers workspace/configuration per folder (scopeUri). Writes what it saw to OUT as JSON;
-- test/lsp/neovim-folders.test.ts judges it. ROOT (the repo), WS (a temporary folder holding `a` and `b`), OUT.
local common = dofile(os.getenv('ROOT') .. '/test/lsp/neovim/common.lua')
local ROOT, WS, TIMEOUT = common.ROOT, common.WS, common.TIMEOUT

local seen = { steps = {}, errors = {}, asked = {} }
local save = common.saver(seen)

-- Each folder's `tickmark` section: the clock the firmware's build would define.
local per_folder = {
  [vim.uri_from_fname(WS .. '/a')] = { c = { defines = { 'F_CPU=8000000' } } },
  [vim.uri_from_fname(WS .. '/b')] = { c = { defines = { 'F_CPU=16000000' } } },
}
local function configuration(_, result)
  local answers = {}
  for _, item in ipairs(result.items) do
    table.insert(seen.asked, { section = item.section or vim.NIL, scopeUri = item.scopeUri or vim.NIL })
    if item.section == 'tickmark' then table.insert(answers, per_folder[item.scopeUri] or vim.NIL)
    else table.insert(answers, vim.NIL) end
  end
  save()
  return answers
end

local last = {}
local function on_publish(err, result, ctx, config)
  last[result.uri] = result
  return vim.lsp.handlers['textDocument/publishDiagnostics'](err, result, ctx, config)
end

local client_id = vim.lsp.start_client({
  name = 'tickmark',
  cmd = { 'node', ROOT .. '/bin/tickmark.js', 'lsp', '--stdio' },
  root_dir = WS .. '/a',
  workspace_folders = {
    { uri = vim.uri_from_fname(WS .. '/a'), name = 'a' },
    { uri = vim.uri_from_fname(WS .. '/b'), name = 'b' },
  },
  handlers = { ['textDocument/publishDiagnostics'] = on_publish, ['workspace/configuration'] = configuration },
  -- Neovim 0.7 answers workspace/configuration but does not say so; a configuration that answers it per folder
  -- (as here) says it, as nvim-lspconfig's defaults do.
  capabilities = vim.tbl_deep_extend('force', vim.lsp.protocol.make_client_capabilities(), { workspace = { configuration = true } }),
})
assert(client_id, 'the client did not start')
local function client() return vim.lsp.get_client_by_id(client_id) end

local function open(path)
  local buf = vim.fn.bufadd(path)
  vim.fn.bufload(buf)
  vim.api.nvim_buf_set_option(buf, 'filetype', 'c')
  vim.lsp.buf_attach_client(buf, client_id)
  return buf, vim.uri_from_fname(path)
end

local function lens_titles(buf, uri)
  local answer = client().request_sync('textDocument/codeLens', { textDocument = { uri = uri } }, TIMEOUT, buf)
  local titles = {}
  for _, lens in ipairs((answer and answer.result) or {}) do table.insert(titles, lens.command.title) end
  return titles
end

local ok, failure = pcall(function()
  vim.wait(TIMEOUT, function() return client() ~= nil and client().initialized end, 50)
  local a_buf, a_uri = open(WS .. '/a/tick.c')
  local b_buf, b_uri = open(WS .. '/b/tick.c')
  vim.wait(TIMEOUT, function() return last[a_uri] ~= nil and last[b_uri] ~= nil end, 50)
  -- Settings arrive after the first analysis: ask until each file's lens shows its folder's clock (a request inside
  -- a vim.wait condition would wait within a wait, so the loop asks between short waits).
  for _ = 1, 100 do
    local a, b = lens_titles(a_buf, a_uri)[1] or '', lens_titles(b_buf, b_uri)[1] or ''
    if a:find('1 kHz', 1, true) and b:find('2 kHz', 1, true) then break end
    vim.wait(100)
  end
  seen.steps.aLens = lens_titles(a_buf, a_uri)
  seen.steps.bLens = lens_titles(b_buf, b_uri)
  local function codes(uri)
    local found = {}
    for _, d in ipairs((last[uri] or { diagnostics = {} }).diagnostics) do table.insert(found, d.code) end
    return found
  end
  seen.steps.aCodes = codes(a_uri)
  seen.steps.bCodes = codes(b_uri)
end)
if not ok then table.insert(seen.errors, tostring(failure)) end
seen.done = true
save()
vim.lsp.stop_client(client_id)
vim.wait(5000, function() return vim.lsp.get_client_by_id(client_id) == nil end, 50)
vim.cmd('qa!')
