-- Drives Neovim's own LSP client through a plan, after the README's configuration has been
-- loaded as init.lua, and writes what Neovim saw as JSON. The plan (a JSON file named by
-- PNEUMARK_NVIM_PLAN) lists notes to open, each with what to ask about it:
--   { "out": path, "notes": [ { "path": ..., "waitFor": code, "hovers": [[line, character]],
--                                "format": true, "complete": [line, character],
--                                "action": { "line": n, "title": text },
--                                "then": { "write": { "path": ..., "text": ... },
--                                          "edit": { "line": n, "find": ..., "text": ... },
--                                          "waitGone": code, "waitFor": code } } ] }
-- Lines and characters count from 0, as in LSP. `complete` asks for completions there (the
-- words Neovim's completion menu would offer); `action` asks for the code actions of a line with
-- its diagnostics, as vim.lsp.buf.code_action does, and applies the first whose title holds
-- `title`. `then` writes a file behind Neovim's back (a
-- project file) or edits the buffer as typing would (the first `find` on the line becomes
-- `text`; Neovim sends the change as an incremental edit), then waits until no diagnostic has
-- the code `waitGone` and one has `waitFor`. Every wait has a deadline; the outcome of each
-- wait is in the output, so the test says what did not arrive.
local plan = vim.json.decode(table.concat(vim.fn.readfile(os.getenv('PNEUMARK_NVIM_PLAN')), '\n'))
local TIMEOUT = 15000
local out = { nvim = tostring(vim.version().major) .. '.' .. vim.version().minor .. '.' .. vim.version().patch, notes = {} }

local function attached(buf)
  for _, client in pairs(vim.lsp.buf_get_clients(buf)) do
    if client.name == 'pneumark' and client.initialized then return client end
  end
  return nil
end

local function has_code(buf, code)
  for _, d in ipairs(vim.diagnostic.get(buf)) do
    if d.code == code then return true end
  end
  return false
end

local function diagnostics(buf)
  local seen = {}
  for _, d in ipairs(vim.diagnostic.get(buf)) do
    table.insert(seen, { code = d.code or vim.NIL, message = d.message, lnum = d.lnum, col = d.col, end_col = d.end_col, severity = d.severity, source = d.source or vim.NIL })
  end
  return seen
end

for _, note in ipairs(plan.notes) do
  vim.cmd('edit ' .. vim.fn.fnameescape(note.path))
  local buf = vim.api.nvim_get_current_buf()
  local seen = { path = note.path, filetype = vim.bo[buf].filetype }
  seen.attached = vim.wait(TIMEOUT, function() return attached(buf) ~= nil end, 20)
  local client = attached(buf)
  if client then
    seen.client = { root = client.config.root_dir or vim.NIL, id = client.id }
  end
  if note.waitFor then
    seen.diagnosticsArrived = vim.wait(TIMEOUT, function() return has_code(buf, note.waitFor) end, 20)
  end
  seen.diagnostics = diagnostics(buf)
  seen.hovers = {}
  for _, at in ipairs(note.hovers or {}) do
    local params = { textDocument = { uri = vim.uri_from_bufnr(buf) }, position = { line = at[1], character = at[2] } }
    local replies = vim.lsp.buf_request_sync(buf, 'textDocument/hover', params, TIMEOUT) or {}
    local text = vim.NIL
    for _, reply in pairs(replies) do
      if reply.result and reply.result.contents then text = reply.result.contents.value or vim.NIL end
    end
    table.insert(seen.hovers, text)
  end
  if note.complete then
    local params = { textDocument = { uri = vim.uri_from_bufnr(buf) }, position = { line = note.complete[1], character = note.complete[2] } }
    seen.completions = {}
    for _, reply in pairs(vim.lsp.buf_request_sync(buf, 'textDocument/completion', params, TIMEOUT) or {}) do
      for _, item in ipairs(vim.lsp.util.text_document_completion_list_to_complete_items(reply.result or {}, '')) do
        table.insert(seen.completions, item.word)
      end
    end
  end
  if note.action then
    local line = note.action.line
    local params = {
      textDocument = { uri = vim.uri_from_bufnr(buf) },
      range = { start = { line = line, character = 0 }, ['end'] = { line = line + 1, character = 0 } },
      context = { diagnostics = vim.lsp.diagnostic.get_line_diagnostics(buf, line) },
    }
    seen.actions = {}
    local applied = false
    for _, reply in pairs(vim.lsp.buf_request_sync(buf, 'textDocument/codeAction', params, TIMEOUT) or {}) do
      for _, action in ipairs(reply.result or {}) do
        table.insert(seen.actions, action.title)
        if not applied and action.edit and action.title:find(note.action.title, 1, true) then
          vim.lsp.util.apply_workspace_edit(action.edit, attached(buf).offset_encoding)
          applied = true
        end
      end
    end
    seen.acted = vim.api.nvim_buf_get_lines(buf, 0, -1, false)
  end
  if note.format then
    vim.lsp.buf.formatting_sync(nil, TIMEOUT)
    seen.formatted = vim.api.nvim_buf_get_lines(buf, 0, -1, false)
  end
  if note['then'] then
    local step = note['then']
    if step.write then
      vim.fn.writefile(vim.split(step.write.text, '\n', true), step.write.path, 'b')
    end
    if step.edit then
      local line = vim.api.nvim_buf_get_lines(buf, step.edit.line, step.edit.line + 1, true)[1]
      local from = line:find(step.edit.find, 1, true) - 1
      vim.api.nvim_buf_set_text(buf, step.edit.line, from, step.edit.line, from + #step.edit.find, vim.split(step.edit.text, '\n', true))
    end
    seen.settled = vim.wait(TIMEOUT, function()
      return not (step.waitGone and has_code(buf, step.waitGone)) and not (step.waitFor and not has_code(buf, step.waitFor))
    end, 20)
    seen.after = diagnostics(buf)
  end
  table.insert(out.notes, seen)
end

vim.fn.writefile({ vim.json.encode(out) }, plan.out)
vim.cmd('qall!')
