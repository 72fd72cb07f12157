/** What a task may do besides computing: report progress (methods filled so far, of how many). */
export interface TaskContext { progress: (done: number, total: number) => void }
