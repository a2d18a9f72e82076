// cmd_solve
