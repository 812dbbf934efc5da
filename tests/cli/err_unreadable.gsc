# error case: unreadable (the arguments name a file that does not exist)
