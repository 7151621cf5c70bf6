-- wrk script: each thread walks the URL paths given after "--" in turn, each from its own starting place, so that
-- point, series and layer requests are mixed evenly over the run.
local threads = 0
local paths = {}
local next_index = 1

function setup(thread)
  threads = threads + 1
  thread:set("thread_number", threads)
end

function init(args)
  for _, path in ipairs(args) do paths[#paths + 1] = path end
  next_index = ((thread_number or 1) * 7) % #paths + 1
end

function request()
  local path = paths[next_index]
  next_index = next_index % #paths + 1
  return wrk.format("GET", path)
end
