// Every API test request on a fresh connection. With keep-alive, a request could be written on an idle socket at the
// moment the server closed it (its 5 s idle timeout), and fail with "other side closed": it happened once on a loaded
// machine, after a test whose 200 MiB upload kept this process busy past the client's own 4 s idle limit.
// undici 6.24.1 is the undici inside Node.js 20's fetch, so its global dispatcher setting applies to fetch.
import { Agent, setGlobalDispatcher } from 'undici'

setGlobalDispatcher(new Agent({ pipelining: 0 }))
