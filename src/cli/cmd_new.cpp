// cmd_new
