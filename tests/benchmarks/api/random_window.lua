-- wrk script: every request asks for the point statistics of a new position and a new custom window, so that no
-- cache can answer it. Arguments after "--": SLUG WEST SOUTH EAST NORTH FIRST_YEAR LAST_YEAR [SEED].
-- Per request: a position drawn uniformly inside the extent (west..east, south..north), a year range from..to drawn
-- within FIRST_YEAR..LAST_YEAR (from <= to), and a non-empty set of calendar months (each month in with chance 1/2,
-- drawn again when none is in), with include=none (summaries only).
-- Each thread seeds its own generator (SEED plus the thread's number), so threads draw different requests and a run
-- can be repeated. Status codes are counted per thread and summed in done(): 2xx, 422 (the position is refused: too
-- far from any wet cell, by design) and any other code, printed as "random-window status: ..." for the shell script.
local threads = {}
local slug, west, south, east, north, first_year, last_year
status_2xx, status_422, status_other = 0, 0, 0   -- globals: done() reads them with thread:get

function setup(thread)
  threads[#threads + 1] = thread
  thread:set("thread_number", #threads)
end

function init(args)
  if #args < 7 then
    error("random_window.lua needs SLUG WEST SOUTH EAST NORTH FIRST_YEAR LAST_YEAR [SEED] after --")
  end
  slug = args[1]
  west, south, east, north = tonumber(args[2]), tonumber(args[3]), tonumber(args[4]), tonumber(args[5])
  first_year, last_year = tonumber(args[6]), tonumber(args[7])
  local seed = tonumber(args[8] or "1")
  math.randomseed(seed * 1000003 + (thread_number or 1) * 7919)
  for _ = 1, 10 do math.random() end   -- the first draws after seeding are poorly spread in some Lua builds
end

local function months()
  local chosen = {}
  while #chosen == 0 do
    for m = 1, 12 do
      if math.random() < 0.5 then chosen[#chosen + 1] = m end
    end
  end
  return table.concat(chosen, ",")
end

function request()
  local lat = south + (north - south) * math.random()
  local lon = west + (east - west) * math.random()
  local a = math.random(first_year, last_year)
  local b = math.random(first_year, last_year)
  if a > b then a, b = b, a end
  local path = string.format("/api/v1/datasets/%s/point?lat=%.5f&lon=%.5f&from=%d&to=%d&months=%s&include=none",
    slug, lat, lon, a, b, months())
  return wrk.format("GET", path)
end

function response(status, headers, body)
  if status >= 200 and status < 300 then
    status_2xx = status_2xx + 1
  elseif status == 422 then
    status_422 = status_422 + 1
  else
    status_other = status_other + 1
  end
end

function done(summary, latency, requests)
  local ok, refused, other = 0, 0, 0
  for _, thread in ipairs(threads) do
    ok = ok + thread:get("status_2xx")
    refused = refused + thread:get("status_422")
    other = other + thread:get("status_other")
  end
  io.write(string.format("random-window status: 2xx %d 422 %d other %d\n", ok, refused, other))
end
