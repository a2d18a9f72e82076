// cmd_build
