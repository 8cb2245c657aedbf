-- Drives `tickmark lsp --stdio` from Neovim's built-in LSP client (Neovim 0.7), headless. Every step writes
-- what Neovim saw to OUT as JSON; test/lsp/neovim.test.ts judges it. Run by that test with ROOT (the repo),
-- WS (a temporary copy of the fixture workspace) and OUT in the environment.
local common = dofile(os.getenv('ROOT') .. '/test/lsp/neovim/common.lua')
local ROOT, WS, TIMEOUT = common.ROOT, common.WS, common.TIMEOUT

local seen = { steps = {}, publishes = {}, errors = {} }
local save = common.saver(seen)

local function step(name, value)
  seen.steps[name] = value
  save()
end

-- The raw diagnostics of the last publish per URI, as the server sent them (with `data`).
local last = {}
local published = 0

local function on_publish(err, result, ctx, config)
  published = published + 1
  last[result.uri] = result
  local codes = {}
  for _, d in ipairs(result.diagnostics) do table.insert(codes, d.code) end
  table.insert(seen.publishes, { uri = result.uri, version = result.version or vim.NIL, codes = codes })
  save()
  return vim.lsp.handlers['textDocument/publishDiagnostics'](err, result, ctx, config)
end

local exited = false
local client_id = vim.lsp.start_client({
  name = 'tickmark',
  cmd = { 'node', ROOT .. '/bin/tickmark.js', 'lsp', '--stdio' },
  root_dir = WS,
  init_options = { tickmark = { ['check.defaultTolerance'] = 1 } },
  handlers = { ['textDocument/publishDiagnostics'] = on_publish },
  on_exit = function(code) exited = true; seen.exitCode = code end,
})
assert(client_id, 'the client did not start')

local function client()
  return vim.lsp.get_client_by_id(client_id)
end

local function open(relative, filetype)
  local path = WS .. '/' .. relative
  local buf = vim.fn.bufadd(path)
  vim.fn.bufload(buf)
  vim.api.nvim_buf_set_option(buf, 'filetype', filetype)
  vim.lsp.buf_attach_client(buf, client_id)
  return buf, vim.uri_from_fname(path)
end

local function codes_of(uri)
  local result = last[uri]
  if not result then return nil end
  local codes = {}
  for _, d in ipairs(result.diagnostics) do table.insert(codes, d.code) end
  return codes
end

local function has_code(uri, code)
  for _, c in ipairs(codes_of(uri) or {}) do if c == code then return true end end
  return false
end

local function request(method, params, buf)
  local answer, err = client().request_sync(method, params, TIMEOUT, buf)
  if not answer then error(method .. ' failed: ' .. tostring(err)) end
  if answer.err then error(method .. ' answered an error: ' .. vim.inspect(answer.err)) end
  return answer.result
end

local function line_of(buf, needle)
  for i, text in ipairs(vim.api.nvim_buf_get_lines(buf, 0, -1, false)) do
    local col = text:find(needle, 1, true)
    if col then return i - 1, col - 1 end
  end
  error(needle .. ' not in the buffer')
end

local function mismatch_on(uri)
  for _, d in ipairs(last[uri].diagnostics) do
    if d.code == 'expect-mismatch' then return d end
  end
end

local function hover_text(result)
  if result == nil or result == vim.NIL then return '' end
  local contents = result.contents
  if type(contents) == 'string' then return contents end
  return contents.value or ''
end

local ok, failure = pcall(function()
  vim.wait(TIMEOUT, function() return client() ~= nil and client().initialized end, 50)
  step('initialized', client() ~= nil and client().initialized == true)

  -- The note: a claim the RC delay does not meet.
  local note, note_uri = open('notes/lamp.md', 'markdown')
  step('noteDiagnostics', vim.wait(TIMEOUT, function() return has_code(note_uri, 'expect-mismatch') end, 50))
  local mismatch = mismatch_on(note_uri)
  step('noteMismatch', { message = mismatch.message, line = mismatch.range.start.line, severity = mismatch.severity, source = mismatch.source })
  local r_line = line_of(note, 'r: 100k')
  step('noteHover', hover_text(request('textDocument/hover', { textDocument = { uri = note_uri }, position = { line = r_line, character = 1 } }, note)))
  local lenses = request('textDocument/codeLens', { textDocument = { uri = note_uri } }, note)
  local titles = {}
  for _, lens in ipairs(lenses or {}) do table.insert(titles, { title = lens.command.title, line = lens.range.start.line, command = lens.command.command }) end
  step('noteLenses', titles)
  local actions = request('textDocument/codeAction', {
    textDocument = { uri = note_uri },
    range = mismatch.range,
    context = { diagnostics = { mismatch }, only = { 'quickfix' } },
  }, note)
  local action_titles = {}
  for _, a in ipairs(actions or {}) do table.insert(action_titles, a.title) end
  step('noteActions', action_titles)
  -- Apply the first fix as a user choosing it would; the edit goes to the server as didChange.
  local before = published
  vim.lsp.util.apply_workspace_edit(actions[1].edit, 'utf-16')
  step('noteAfterFix', vim.api.nvim_buf_get_lines(note, 0, -1, false))
  step('noteCleared', vim.wait(TIMEOUT, function() return published > before and not has_code(note_uri, 'expect-mismatch') end, 50))
  step('noteVersions', { buffer = vim.lsp.util.buf_versions[note], published = last[note_uri].version })

  -- The C file: a timer whose constants come from a header.
  local c_buf, c_uri = open('firmware/dimmer.c', 'c')
  step('cDiagnostics', vim.wait(TIMEOUT, function() return has_code(c_uri, 'expect-mismatch') end, 50))
  local c_mismatch = mismatch_on(c_uri)
  step('cMismatch', { message = c_mismatch.message, line = c_mismatch.range.start.line })
  local reload_line, reload_col = line_of(c_buf, 'reload: DIM_RELOAD')
  step('cHover', hover_text(request('textDocument/hover', { textDocument = { uri = c_uri }, position = { line = reload_line, character = reload_col } }, c_buf)))
  local definition = request('textDocument/definition', { textDocument = { uri = c_uri }, position = { line = reload_line, character = reload_col + #'reload: ' + 2 } }, c_buf)
  if definition and definition[1] then definition = definition[1] end
  step('cDefinition', definition or vim.NIL)
  local c_lenses = request('textDocument/codeLens', { textDocument = { uri = c_uri } }, c_buf)
  step('cLenses', { #c_lenses, c_lenses[1] and c_lenses[1].command.title or '' })
  local c_actions = request('textDocument/codeAction', {
    textDocument = { uri = c_uri },
    range = c_mismatch.range,
    context = { diagnostics = { c_mismatch } },
  }, c_buf)
  local c_titles, header_edit = {}, nil
  for _, a in ipairs(c_actions or {}) do
    table.insert(c_titles, a.title)
    if a.title:find('DIM_RELOAD', 1, true) then header_edit = a.edit end
  end
  step('cActions', c_titles)
  step('cActionFiles', header_edit and vim.tbl_keys(header_edit.changes) or {})
  -- The fix edits the header: Neovim loads it into a buffer; attached, the server reads the edited buffer
  -- and analyses the C file that includes it again.
  before = published
  vim.lsp.util.apply_workspace_edit(header_edit, 'utf-16')
  local header = vim.fn.bufnr(WS .. '/firmware/lamp.h')
  step('headerAfterFix', vim.api.nvim_buf_get_lines(header, 0, -1, false))
  vim.api.nvim_buf_set_option(header, 'filetype', 'c')
  vim.lsp.buf_attach_client(header, client_id)
  step('cCleared', vim.wait(TIMEOUT, function() return published > before and last[c_uri] ~= nil and not has_code(c_uri, 'expect-mismatch') end, 50))

  -- A plain edit of the C block's claim brings a finding back: 1999 + 1 counts give 500 Hz, not 400 Hz.
  local expect_line = line_of(c_buf, 'expect: 500 Hz')
  before = published
  vim.api.nvim_buf_set_lines(c_buf, expect_line, expect_line + 1, false, { ' * expect: 400 Hz ±1%' })
  step('cEditedBack', vim.wait(TIMEOUT, function() return published > before and has_code(c_uri, 'expect-mismatch') end, 50))
  step('cVersions', { buffer = vim.lsp.util.buf_versions[c_buf], published = last[c_uri].version })
end)

if not ok then table.insert(seen.errors, tostring(failure)) end
seen.done = true
save()
client().stop()
vim.wait(5000, function() return exited end, 50)
seen.serverExited = exited
save()
vim.cmd('qa!')
