-- What the Neovim drivers share: the environment the tests give them (ROOT the repo, WS the workspace, OUT the
-- JSON file the test reads) and writing what they saw there. Loaded with dofile(ROOT .. '/test/lsp/neovim/common.lua').
local common = { ROOT = os.getenv('ROOT'), WS = os.getenv('WS'), OUT = os.getenv('OUT'), TIMEOUT = 20000 }

-- A function that writes `seen` to OUT, called after every step so a crash or hang leaves what came before.
function common.saver(seen)
  return function()
    local file = assert(io.open(common.OUT, 'w'))
    file:write(vim.fn.json_encode(seen))
    file:close()
  end
end

return common
